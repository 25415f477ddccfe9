// Where to send people around sign-in, keeping them on this site.
/** Only same-site paths: a `next` of `//evil.example` or `https://…` must not redirect away. */
export function safeNext(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  return next;
}

/** The sign-in URL that brings the person back to `location` afterwards. */
export function signInPath(location: { pathname: string; search: string }): string {
  const here = location.pathname + location.search;
  return here === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(here)}`;
}
