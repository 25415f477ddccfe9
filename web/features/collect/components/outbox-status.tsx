// The "n changes waiting" bar: shows edits not yet on the server and why, on every collect page.
import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { plural } from '../../../lib/format';
import { flush, useOutbox, useOutboxLoaded } from '../lib/outbox';
import { useUnsavedFields } from '../lib/unsaved-fields';

function useOnline(): boolean {
  const [online, setOnline] = useState(() =>
    typeof navigator === 'undefined' ? true : navigator.onLine,
  );
  useEffect(() => {
    const up = () => setOnline(true);
    const down = () => setOnline(false);
    window.addEventListener('online', up);
    window.addEventListener('offline', down);
    return () => {
      window.removeEventListener('online', up);
      window.removeEventListener('offline', down);
    };
  }, []);
  return online;
}

export function OutboxStatus({ siteId, className }: { siteId?: string; className?: string }) {
  const entries = useOutbox().filter((e) => !siteId || e.siteId === siteId);
  const unsaved = useUnsavedFields(siteId);
  const loaded = useOutboxLoaded();
  const online = useOnline();
  const waiting = entries.filter((e) => e.status === 'pending').length;
  const held = entries.length - waiting;
  if (!loaded) {
    return (
      <p
        role="status"
        data-testid="outbox-status"
        className={cn('text-label text-ink-muted', className)}
      >
        Checking this device for changes not sent yet…
      </p>
    );
  }
  if (entries.length === 0 && unsaved.length === 0) {
    return (
      <p
        role="status"
        data-testid="outbox-status"
        className={cn('text-label text-ink-muted', className)}
      >
        <span aria-hidden="true" className="mr-1.5 inline-block size-2 rounded-full bg-field-500" />
        All changes saved{online ? '' : ' · offline'}
      </p>
    );
  }
  return (
    <div
      role="status"
      data-testid="outbox-status"
      className={cn(
        'flex flex-wrap items-center justify-between gap-2 rounded-field border px-3 py-2 text-label',
        held > 0 || unsaved.length > 0
          ? 'border-danger/40 bg-danger-soft'
          : 'border-caution/40 bg-caution-soft',
        className,
      )}
    >
      {unsaved.length > 0 ? (
        <span className="basis-full">
          <strong className="figures text-danger">
            {plural(unsaved.length, 'box', 'boxes')} not saved
          </strong>{' '}
          — fix {unsaved.length === 1 ? 'it' : 'them'} or clear{' '}
          {unsaved.length === 1 ? 'it' : 'them'}:{' '}
          {unsaved
            .slice(0, 3)
            .map((f) => `${f.place} (${f.message})`)
            .join('; ')}
          {unsaved.length > 3 ? '…' : ''}
        </span>
      ) : null}
      {entries.length > 0 ? (
        <span>
          <strong className="figures">{plural(entries.length, 'change')} waiting</strong>
          {!online
            ? ' · no signal: they are kept on this device and sent when the connection returns'
            : waiting > 0
              ? ' · sending…'
              : ''}
          {held > 0 ? ` · ${plural(held, 'strip')} need${held === 1 ? 's' : ''} your decision` : ''}
        </span>
      ) : null}
      {online && waiting > 0 ? (
        <Button variant="quiet" onClick={() => void flush()}>
          Send now
        </Button>
      ) : null}
    </div>
  );
}
