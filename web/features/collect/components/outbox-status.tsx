// The "n changes waiting" bar: shows edits not yet on the server and why, on every collect page.
import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { plural } from '../../../lib/format';
import { flush, useOutbox } from '../lib/outbox';

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
  const online = useOnline();
  const waiting = entries.filter((e) => e.status === 'pending').length;
  const held = entries.length - waiting;
  if (entries.length === 0) {
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
        held > 0 ? 'border-danger/40 bg-danger-soft' : 'border-caution/40 bg-caution-soft',
        className,
      )}
    >
      <span>
        <strong className="figures">{plural(entries.length, 'change')} waiting</strong>
        {!online
          ? ' · no signal: they are kept on this device and sent when the connection returns'
          : waiting > 0
            ? ' · sending…'
            : ''}
        {held > 0 ? ` · ${plural(held, 'strip')} need${held === 1 ? 's' : ''} your decision` : ''}
      </span>
      {online && waiting > 0 ? (
        <Button variant="quiet" onClick={() => void flush()}>
          Send now
        </Button>
      ) : null}
    </div>
  );
}
