// Invitations sent but not yet accepted, each with a Revoke button.
import type { OpenInvitation } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { errorSummary } from '../../../lib/form-errors';
import { formatDate, roleName } from '../../../lib/format';
import { useRevokeInvitation } from '../api/people';

export function InvitationList({
  networkId,
  invitations,
}: {
  networkId: string;
  invitations: OpenInvitation[];
}) {
  const revoke = useRevokeInvitation(networkId);
  if (invitations.length === 0) {
    return (
      <EmptyState title="No invitations waiting">
        People you invite appear here until they accept.
      </EmptyState>
    );
  }
  return (
    <div className="space-y-3">
      {revoke.isError ? (
        <Alert tone="danger" title="The invitation was not revoked">
          {errorSummary(revoke.error)}
        </Alert>
      ) : null}
      <ul
        className="divide-y divide-line rounded-card border border-line bg-surface shadow-card"
        aria-label="Pending invitations"
      >
        {invitations.map((i) => (
          <li
            key={i.id}
            className="flex flex-col gap-2 p-4 sm:flex-row sm:items-center sm:justify-between"
          >
            <div className="min-w-0">
              <p className="break-all font-semibold text-ink">{i.email}</p>
              <p className="text-caption text-ink-muted">
                {roleName(i.role)} · sent {formatDate(i.createdAt)} · link works until{' '}
                {formatDate(i.expiresAt)}
              </p>
            </div>
            <Button
              variant="secondary"
              aria-label={`Revoke the invitation to ${i.email}`}
              busy={revoke.isPending && revoke.variables === i.id}
              onClick={() => revoke.mutate(i.id)}
            >
              Revoke
            </Button>
          </li>
        ))}
      </ul>
    </div>
  );
}
