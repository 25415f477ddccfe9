// The framed panel that holds each sign-in, reset and invitation form.
import type { ReactNode } from 'react';

export function AuthCard({
  title,
  intro,
  children,
  footer,
}: {
  title: ReactNode;
  intro?: ReactNode;
  children: ReactNode;
  footer?: ReactNode;
}) {
  return (
    <div className="w-full max-w-md">
      <div className="rounded-card border border-line bg-surface p-6 shadow-raised sm:p-8">
        <h1 className="text-title text-ink">{title}</h1>
        {intro ? <div className="mt-2 text-ink-muted">{intro}</div> : null}
        <div className="mt-6">{children}</div>
      </div>
      {footer ? <div className="mt-4 text-center text-label text-ink-muted">{footer}</div> : null}
    </div>
  );
}
