// A small rotating ring with an accessible label, for anything that waits on the network.
import { cn } from '../../lib/cn';

export interface SpinnerProps {
  size?: 'sm' | 'md' | 'lg';
  /** Read by screen readers; pass '' when a surrounding element already says what is loading. */
  label?: string;
  className?: string;
}

const sizes = { sm: 'size-4 border-2', md: 'size-6 border-[3px]', lg: 'size-10 border-4' };

export function Spinner({ size = 'md', label = 'Loading', className }: SpinnerProps) {
  return (
    <span role={label ? 'status' : undefined} className={cn('inline-flex items-center', className)}>
      <span
        aria-hidden="true"
        className={cn(
          'inline-block animate-spin rounded-full border-current border-r-transparent opacity-80',
          sizes[size],
        )}
      />
      {label ? <span className="sr-only">{label}</span> : null}
    </span>
  );
}

/** A centred spinner with visible words, for a page or panel that is still loading. */
export function LoadingBlock({
  label = 'Loading…',
  className,
}: {
  label?: string;
  className?: string;
}) {
  return (
    <div
      role="status"
      className={cn('flex items-center justify-center gap-3 py-12 text-ink-muted', className)}
    >
      <Spinner size="md" label="" className="text-accent" />
      <span>{label}</span>
    </div>
  );
}
