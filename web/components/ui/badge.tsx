// A small label for a status or a count.
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export type BadgeTone = 'neutral' | 'field' | 'straw' | 'info';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-sunken text-ink-muted ring-line-strong/40',
  field: 'bg-accent-soft text-accent ring-accent/25',
  straw: 'bg-straw-100 text-straw-800 ring-straw-400/50 dark:bg-straw-900 dark:text-straw-100',
  info: 'bg-info-soft text-info ring-info/25',
};

export function Badge({
  tone = 'neutral',
  children,
  className,
}: {
  tone?: BadgeTone;
  children: ReactNode;
  className?: string;
}) {
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1 rounded-full px-2.5 py-0.5 text-caption font-semibold ring-1 ring-inset',
        tones[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}
