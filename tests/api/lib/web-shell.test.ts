// The page the server sends for a web URL lists the code of that page, picked the way React Router
// picks a route: a fixed segment beats a parameter, and the catch-all comes last.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createWebShell, ROUTE_PRELOADS_FILE, routeMatchScore } from '../../../api/lib/web-shell';

const INDEX =
  '<!doctype html><html><head><script type="module" src="/assets/index-a.js"></script></head><body><div id="root"></div></body></html>';

function buildFolder(preloads: unknown): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'sheaf-shell-'));
  fs.writeFileSync(path.join(dir, 'index.html'), INDEX);
  if (preloads !== undefined) {
    fs.mkdirSync(path.join(dir, '.vite'));
    fs.writeFileSync(path.join(dir, ROUTE_PRELOADS_FILE), JSON.stringify(preloads));
  }
  return dir;
}

const preloadsIn = (html: string) =>
  [...html.matchAll(/<link rel="modulepreload" crossorigin href="([^"]+)">/g)].map((m) => m[1]);
const dataPreloadsIn = (html: string) =>
  [...html.matchAll(/<link rel="preload" as="fetch" crossorigin href="([^"]+)">/g)].map(
    (m) => m[1],
  );
const withoutDataPreloads = (html: string) =>
  html.replace(/<link rel="preload" as="fetch" crossorigin href="[^"]+">/g, '');

describe('web shell', () => {
  const folders: string[] = [];
  afterAll(() => {
    for (const dir of folders) fs.rmSync(dir, { recursive: true, force: true });
  });

  // From memory: React Router ranks a static segment above a dynamic one and a splat below both
  // (its route ranking in the docs), so /trials/new is the wizard, never a trial called "new".
  it('picks the most specific route path for a URL, as the router does', () => {
    expect(routeMatchScore('/trials/new', '/trials/new')).toBeGreaterThan(
      routeMatchScore('/trials/:trialId', '/trials/new')!,
    );
    expect(routeMatchScore('/trials/:trialId', '/trials/abc')).toBeGreaterThan(
      routeMatchScore('/*', '/trials/abc')!,
    );
    expect(routeMatchScore('/', '/')).not.toBeNull();
    expect(routeMatchScore('/', '/sign-in')).toBeNull();
    expect(routeMatchScore('/sites/:siteId', '/sites/abc/grid')).toBeNull();
    expect(routeMatchScore('/sites/:siteId/grid', '/sites/abc/grid')).not.toBeNull();
  });

  it("lists the asked-for page's code in the page, and nothing for a URL no route knows", () => {
    const dir = buildFolder([
      { path: '/sign-in', files: ['assets/sign-in-b.js', 'assets/auth-layout-c.js'] },
      { path: '/trials/new', files: ['assets/wizard-d.js'] },
      { path: '/trials/:trialId', files: ['assets/trial-e.js'] },
    ]);
    folders.push(dir);
    const shell = createWebShell(dir);

    const signIn = shell('/sign-in');
    expect(preloadsIn(signIn.html)).toEqual(['/assets/sign-in-b.js', '/assets/auth-layout-c.js']);
    expect(signIn.html).toContain('<script type="module" src="/assets/index-a.js">');
    expect(preloadsIn(shell('/trials/new').html)).toEqual(['/assets/wizard-d.js']);
    expect(preloadsIn(shell('/trials/8f0c').html)).toEqual(['/assets/trial-e.js']);

    const unknown = shell('/nothing/here');
    expect(withoutDataPreloads(unknown.html)).toBe(INDEX);
    // The same page always carries the same validator; different pages differ.
    expect(shell('/sign-in').etag).toBe(signIn.etag);
    expect(unknown.etag).not.toBe(signIn.etag);
  });

  it('sends the plain page when the build has no list', () => {
    const dir = buildFolder(undefined);
    folders.push(dir);
    expect(withoutDataPreloads(createWebShell(dir)('/sign-in').html)).toBe(INDEX);
  });

  it('asks for the data a page shows first alongside its code: who is signed in, a site’s strips', () => {
    const dir = buildFolder([
      { path: '/sign-in', files: ['assets/sign-in-b.js'] },
      { path: '/sites/:siteId', files: ['assets/site-f.js'] },
      { path: '/sites/:siteId/grid', files: ['assets/grid-g.js'] },
      { path: '/sites/:siteId/map', files: ['assets/map-h.js'] },
    ]);
    folders.push(dir);
    const shell = createWebShell(dir);
    const siteId = '6f1c2a9e-0b7d-4c1e-9a55-3d2b8e7f4a10';
    expect(dataPreloadsIn(shell('/sign-in').html)).toEqual(['/api/auth/me']);
    expect(dataPreloadsIn(shell(`/sites/${siteId}`).html)).toEqual([
      '/api/auth/me',
      `/api/sites/${siteId}/strips`,
    ]);
    expect(dataPreloadsIn(shell(`/sites/${siteId}/grid`).html)).toEqual([
      '/api/auth/me',
      `/api/sites/${siteId}/strips`,
    ]);
    // Only pages that show the strips first ask for them.
    expect(dataPreloadsIn(shell(`/sites/${siteId}/map`).html)).toEqual(['/api/auth/me']);
    // A segment that is not a plain id never reaches the page.
    const odd = shell('/sites/%22%3E%3Cscript%3E');
    expect(dataPreloadsIn(odd.html)).toEqual(['/api/auth/me']);
    expect(odd.html).not.toContain('script%3E');
    // The page's validator follows what the page asks for.
    expect(shell(`/sites/${siteId}`).etag).not.toBe(shell('/sites/another-site').etag);
  });
});
