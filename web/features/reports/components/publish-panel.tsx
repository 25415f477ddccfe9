// Publishing status for everyone, and publish / unpublish / re-publish buttons for coordinators.
import type { ReactNode } from 'react';
import type { PublishedInfo } from '../../../../shared/schemas/report';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { errorSummary } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';

export interface PublishPanelProps {
  what: string;
  published: PublishedInfo | null;
  changed: boolean;
  canPublish: boolean;
  busy: boolean;
  error: unknown;
  onAction: (action: 'publish' | 'unpublish') => void;
  /** Extra controls (the public link) shown once published. */
  children?: ReactNode;
  lockNote?: string;
}

export function PublishPanel({
  what,
  published,
  changed,
  canPublish,
  busy,
  error,
  onAction,
  children,
  lockNote,
}: PublishPanelProps) {
  return (
    <div className="no-print space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        {published ? (
          <Badge tone="field">Published {formatDateTime(published.publishedAt)}</Badge>
        ) : (
          <Badge tone="neutral">Not published</Badge>
        )}
        {canPublish ? (
          published ? (
            <>
              {changed ? (
                <Button size="md" busy={busy} onClick={() => onAction('publish')}>
                  Re-publish with current data
                </Button>
              ) : null}
              <Button variant="secondary" busy={busy} onClick={() => onAction('unpublish')}>
                Unpublish
              </Button>
            </>
          ) : (
            <Button busy={busy} onClick={() => onAction('publish')}>
              Publish {what}
            </Button>
          )
        ) : null}
      </div>
      {published && changed ? (
        <Alert tone="caution" title="Data changed since publishing">
          {canPublish
            ? `Members still see the ${what} as published. Re-publish to show the current numbers.`
            : `This is the ${what} as published; the data have been changed since, and the coordinator may publish an update.`}
        </Alert>
      ) : null}
      {canPublish && !published && lockNote ? (
        <p className="text-caption text-ink-muted">{lockNote}</p>
      ) : null}
      {error ? <Alert tone="danger">{errorSummary(error)}</Alert> : null}
      {published ? children : null}
    </div>
  );
}
