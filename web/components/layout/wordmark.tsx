// Sheaf's mark (three stalks gathered by a band) and name.
import { cn } from '../../lib/cn';

export function SheafMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" className={cn('size-8', className)}>
      <rect width="32" height="32" rx="7" className="fill-field-900" />
      <g fill="none" className="stroke-straw-300" strokeWidth="2.2" strokeLinecap="round">
        <path d="M16 27V9" />
        <path d="M16 20 9.5 8" />
        <path d="M16 20 22.5 8" />
      </g>
      <path d="M11.5 19.5h9" className="stroke-straw-50" strokeWidth="2.6" strokeLinecap="round" />
      <g className="fill-straw-300">
        <ellipse cx="16" cy="7" rx="2.2" ry="3.4" />
        <ellipse cx="9" cy="6.8" rx="2" ry="3.1" transform="rotate(-28 9 6.8)" />
        <ellipse cx="23" cy="6.8" rx="2" ry="3.1" transform="rotate(28 23 6.8)" />
      </g>
    </svg>
  );
}

export function Wordmark({
  className,
  tone = 'light',
}: {
  className?: string;
  tone?: 'light' | 'dark';
}) {
  return (
    <span className={cn('inline-flex items-center gap-2', className)}>
      <SheafMark />
      <span
        className={cn(
          'text-[1.35rem] font-bold tracking-tight',
          tone === 'light' ? 'text-straw-50' : 'text-ink',
        )}
      >
        Sheaf
      </span>
    </span>
  );
}
