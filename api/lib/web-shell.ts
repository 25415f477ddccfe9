// The page the server sends for every URL of the web app: the built index.html, plus a
// <link rel="modulepreload"> for each file the asked-for page loads on top of the entry code. The
// build lists those files per route path in `.vite/route-preloads.json` (see vite.config.ts), so a
// first visit downloads the page's own code together with the entry code instead of one round
// trip after the entry has run. Build files never change while the server runs: each path
// pattern's page is put together once.
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
  const pageFor = (route: RoutePreload | undefined): ShellPage => {
    if (!route || route.files.length === 0) return plain;
    const cached = pages.get(route.path);
    if (cached) return cached;
    const links = route.files
      .map((file) => `<link rel="modulepreload" crossorigin href="/${escapeAttribute(file)}">`)
      .join('');
    const page = shellPage(plain.html.replace('</head>', `${links}</head>`));
    pages.set(route.path, page);
    return page;
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
    return pageFor(best);
  };
}
