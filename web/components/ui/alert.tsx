// A message box for errors, cautions and information, announced to screen readers when it matters.
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export type AlertTone = 'info' | 'success' | 'caution' | 'danger';

const tones: Record<AlertTone, { box: string; mark: string; symbol: string }> = {
  info: { box: 'border-info/30 bg-info-soft', mark: 'bg-info text-info-soft', symbol: 'i' },
  success: {
    box: 'border-accent/30 bg-accent-soft',
    mark: 'bg-accent text-on-accent',
    symbol: '✓',
  },
  caution: {
    box: 'border-caution/40 bg-caution-soft',
    mark: 'bg-caution text-caution-soft',
    symbol: '!',
  },
  danger: {
    box: 'border-danger/40 bg-danger-soft',
    mark: 'bg-danger text-danger-soft',
    symbol: '×',
  },
};

export interface AlertProps {
  tone?: AlertTone;
  title?: ReactNode;
  children?: ReactNode;
  action?: ReactNode;
  className?: string;
}

export function Alert({ tone = 'info', title, children, action, className }: AlertProps) {
  const style = tones[tone];
  return (
    <div
      role={tone === 'danger' ? 'alert' : 'status'}
      className={cn('flex gap-3 rounded-field border p-4 text-ink', style.box, className)}
    >
      <span
        aria-hidden="true"
        className={cn(
          'mt-0.5 flex size-5 shrink-0 items-center justify-center rounded-full text-xs font-bold',
          style.mark,
        )}
      >
        {style.symbol}
      </span>
      <div className="min-w-0 flex-1 space-y-1">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className="text-label font-normal text-ink">{children}</div> : null}
        {action ? <div className="pt-2">{action}</div> : null}
      </div>
    </div>
  );
}
