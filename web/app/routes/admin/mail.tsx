// /admin/mail: messages the development mail catcher received, so invitation and reset links can be followed.
import type { QueryClient } from '@tanstack/react-query';
import { Fragment } from 'react';
import { redirect, useRouteError } from 'react-router-dom';
import type { CaughtMail } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { caughtMailQueryOptions, useCaughtMail } from '../../../features/admin/api/get-caught-mail';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import { isApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { errorSummary } from '../../../lib/form-errors';
import { isAdmin } from '../../../lib/session';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  // Loaders run in parallel: a signed-out visitor is redirected by the app layout (with `next`).
  if (!user) return null;
  if (!isAdmin(user)) throw redirect('/');
  await queryClient.ensureQueryData(caughtMailQueryOptions());
  return null;
};

/** Plain text with its http(s) links made clickable; everything else stays text. */
function LinkedText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((part, i) =>
        /^https?:\/\//.test(part) ? (
          <a key={i} href={part} className="break-all text-accent underline">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </>
  );
}

function MailItem({ mail }: { mail: CaughtMail }) {
  return (
    <li className="rounded-card border border-line bg-surface shadow-card">
      <details className="group">
        <summary className="flex cursor-pointer list-none flex-col gap-1 p-4 sm:flex-row sm:items-center sm:justify-between">
          <span className="min-w-0">
            <span className="block font-semibold text-ink">{mail.subject || '(no subject)'}</span>
            <span className="block break-all text-label text-ink-muted">
              to {mail.to.join(', ')}
            </span>
          </span>
          <span className="figures shrink-0 text-caption text-ink-muted">
            {formatDateTime(mail.receivedAt)}
          </span>
        </summary>
        <div className="border-t border-line p-4">
          <p className="mb-3 text-caption text-ink-muted">from {mail.from}</p>
          <pre className="whitespace-pre-wrap break-words font-sans text-label text-ink">
            <LinkedText text={mail.text} />
          </pre>
        </div>
      </details>
    </li>
  );
}

export default function CaughtMailPage() {
  const mail = useCaughtMail();
  const sorted = [...(mail.data ?? [])].sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
  return (
    <>
      <PageHeader
        eyebrow="Administration"
        title="Caught e-mail"
        description="Outside production Sheaf keeps outgoing mail here instead of sending it. Open a message to follow its invitation or reset link."
        actions={
          <Button variant="secondary" onClick={() => mail.refetch()} busy={mail.isFetching}>
            Refresh
          </Button>
        }
      />
      {mail.isError && !mail.data ? (
        <Alert tone="danger">{errorSummary(mail.error)}</Alert>
      ) : !mail.data ? (
        <LoadingBlock label="Loading mail…" />
      ) : sorted.length === 0 ? (
        <EmptyState title="No mail caught yet">
          Invitations and password-reset messages appear here as soon as Sheaf sends them.
        </EmptyState>
      ) : (
        <ul className="space-y-3">
          {sorted.map((m) => (
            <MailItem key={m.id} mail={m} />
          ))}
        </ul>
      )}
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error)) {
    return (
      <NotFoundPanel title="Mail catching is off">
        This server sends real e-mail, so there is nothing caught to show.
      </NotFoundPanel>
    );
  }
  if (isApiError(error, 403)) {
    return <Alert tone="caution">Only administrators can read caught e-mail.</Alert>;
  }
  throw error;
}
