// The page the server sends for every URL of the web app: the built index.html, plus a
// <link rel="modulepreload"> for each file the asked-for page loads on top of the entry code. The
// build lists those files per route path in `.vite/route-preloads.json` (see vite.config.ts), so a
// first visit downloads the page's own code together with the entry code instead of one round
// trip after the entry has run. Build files never change while the server runs: each path
// pattern's page is put together once.
//
// The page also asks for the API answers it shows first (`<link rel="preload" as="fetch">`): who
// is signed in, and on a site page its strips. They then download alongside the app's code
// instead of after it has run, and the app's own request for them takes the preloaded answer.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export const ROUTE_PRELOADS_FILE = path.join('.vite', 'route-preloads.json');

interface RoutePreload {
  /** A React Router path: `/sites/:siteId`, `/` for the home page, `/*` for the catch-all. */
  path: string;
  files: string[];
}

/** How well a route path fits a URL path: `null` when it does not; more specific scores higher. */
export function routeMatchScore(pattern: string, pathname: string): number | null {
  const want = pattern.split('/').filter(Boolean);
  const have = pathname.split('/').filter(Boolean);
  let score = 0;
  for (const [i, segment] of want.entries()) {
    if (segment === '*') return score + 1; // the splat takes the rest, and loses to anything else
    const part = have[i];
    if (part === undefined) return null;
    if (segment.startsWith(':')) score += 3;
    else if (segment === part) score += 10;
    else return null;
  }
  return have.length === want.length ? score + 2 : null;
}

function readPreloads(webRoot: string): RoutePreload[] {
  try {
    const list = JSON.parse(fs.readFileSync(path.join(webRoot, ROUTE_PRELOADS_FILE), 'utf8'));
    return Array.isArray(list) ? list : [];
  } catch {
    return []; // a build without the list: pages still work, they just load their code later
  }
}

const escapeAttribute = (value: string) => value.replace(/&/g, '&amp;').replace(/"/g, '&quot;');

/** Who is signed in: every page asks first (web/app/start.tsx). */
const SIGNED_IN_CHECK = '/api/auth/me';

/**
 * The API answers a page needs for its first paint, by route path; `:name` is filled from the
 * URL. Kept to what the pages' loader asks for (`siteStripsLoader` in
 * web/app/routes/sites/collect-route.tsx).
 */
const SITE_STRIPS = ['/api/sites/:siteId/strips'];
const FIRST_DATA: Record<string, string[]> = {
  '/sites/:siteId': SITE_STRIPS,
  '/sites/:siteId/strips/:stripId': SITE_STRIPS,
  '/sites/:siteId/grid': SITE_STRIPS,
  '/sites/:siteId/import': SITE_STRIPS,
  '/sites/:siteId/photos': SITE_STRIPS,
  '/sites/:siteId/history': SITE_STRIPS,
};

/** The URL's value for each `:name` of a route path; null when a value is not a plain id. */
function routeParams(pattern: string, pathname: string): Map<string, string> | null {
  const want = pattern.split('/').filter(Boolean);
  const have = pathname.split('/').filter(Boolean);
  const params = new Map<string, string>();
  for (const [i, segment] of want.entries()) {
    if (!segment.startsWith(':')) continue;
    const value = have[i] ?? '';
    if (!/^[A-Za-z0-9-]{1,64}$/.test(value)) return null;
    params.set(segment, value);
  }
  return params;
}

const fetchPreload = (url: string) =>
  `<link rel="preload" as="fetch" crossorigin href="${escapeAttribute(url)}">`;

/** The preload links of the data a page shows first. */
function dataPreloads(route: RoutePreload | undefined, pathname: string): string {
  const urls = [SIGNED_IN_CHECK];
  const wanted = route ? FIRST_DATA[route.path] : undefined;
  const params = wanted && route ? routeParams(route.path, pathname) : null;
  if (wanted && params)
    for (const template of wanted)
      urls.push(template.replace(/:[A-Za-z]+/g, (name) => params.get(name) ?? name));
  return urls.map(fetchPreload).join('');
}

export interface ShellPage {
  html: string;
  /** A strong validator of the HTML, so a browser revalidating the page gets a 304. */
  etag: string;
}

const shellPage = (html: string): ShellPage => ({
  html,
  etag: `"${crypto.createHash('sha256').update(html).digest('base64url').slice(0, 27)}"`,
});

/** Returns (pathname) => the app's page for that URL. */
export function createWebShell(webRoot: string): (pathname: string) => ShellPage {
  const plain = shellPage(fs.readFileSync(path.join(webRoot, 'index.html'), 'utf8'));
  const preloads = readPreloads(webRoot);
  const pages = new Map<string, ShellPage>();
  const codeFor = (route: RoutePreload | undefined): string => {
    if (!route || route.files.length === 0) return plain.html;
    const cached = pages.get(route.path);
    if (cached) return cached.html;
    const links = route.files
      .map((file) => `<link rel="modulepreload" crossorigin href="/${escapeAttribute(file)}">`)
      .join('');
    const page = shellPage(plain.html.replace('</head>', `${links}</head>`));
    pages.set(route.path, page);
    return page.html;
  };
  return (pathname) => {
    let best: RoutePreload | undefined;
    let bestScore = -1;
    for (const route of preloads) {
      const score = routeMatchScore(route.path, pathname);
      if (score !== null && score > bestScore) {
        best = route;
        bestScore = score;
      }
    }
    return shellPage(codeFor(best).replace('</head>', `${dataPreloads(best, pathname)}</head>`));
  };
}
