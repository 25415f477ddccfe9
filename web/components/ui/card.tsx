// A bordered surface for grouping related content; optionally the whole card is a link.
import type { HTMLAttributes, ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '../../lib/cn';

const surface = 'rounded-card border border-line bg-surface shadow-card';

export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn(surface, 'p-5', className)} {...rest} />;
}

export interface LinkCardProps {
  to: string;
  children: ReactNode;
  className?: string;
  'aria-label'?: string;
}

/** A card that is one big link: hover and focus lift it so it reads as clickable. */
export function LinkCard({ to, children, className, ...rest }: LinkCardProps) {
  return (
    <Link
      to={to}
      className={cn(
        surface,
        'group block p-5 no-underline transition hover:-translate-y-0.5 hover:border-line-strong hover:shadow-raised',
        className,
      )}
      {...rest}
    >
      {children}
    </Link>
  );
}
