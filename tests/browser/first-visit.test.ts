// A first visit on a phone loads only the code of the page asked for, and the page the server sends
// names all of it, so the browser fetches it at once rather than after the entry code has run.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, signInThroughUi, startTestServer } from '../helpers/browser';

const GROWER = 'grower1@millbrook.example';
/** Code only other pages need: charts, the trial wizard, the grid, CSV import. */
const OTHER_PAGES = /vega|trial-wizard|\/grid-|\/import-|papaparse/;

/** Opens `url` and returns the app's script files the page fetched, and the HTML it was sent. */
async function scriptsOf(page: Page, url: string, ready: () => Promise<unknown>) {
  const scripts = new Set<string>();
  const listen = (request: { url(): string; resourceType(): string }) => {
    const { pathname } = new URL(request.url());
    if (request.resourceType() === 'script' && pathname.startsWith('/assets/'))
      scripts.add(pathname);
  };
  page.on('request', listen);
  const response = await page.goto(url);
  await ready();
  page.off('request', listen);
  return { scripts: [...scripts], html: (await response?.text()) ?? '' };
}

describe('first visit', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('loads the sign-in page and a grower’s site page with only their own code, all named in the page sent', async () => {
    const { page, errors, close } = await openPage(browser, 390);
    try {
      const signIn = await scriptsOf(page, `${server.baseUrl}/sign-in`, () =>
        page.getByRole('button', { name: 'Sign in' }).waitFor(),
      );
      expect(signIn.scripts.some((file) => /\/sign-in-[\w-]+\.js$/.test(file))).toBe(true);
      expect(signIn.scripts.filter((file) => OTHER_PAGES.test(file))).toEqual([]);
      expect(signIn.scripts.filter((file) => !signIn.html.includes(`"${file}"`))).toEqual([]);
      // Signing in downloads none of the grower's pages (vite.config.ts, sitePageChunks).
      expect(signIn.scripts.filter((file) => /\/site-page/.test(file))).toEqual([]);

      await signInThroughUi(page, server.baseUrl, GROWER);
      const mine = await (await page.request.get(`${server.baseUrl}/api/sites/mine`)).json();
      const siteId = (Array.isArray(mine) ? mine : mine.items)[0].id as string;
      // A new tab, as when the grower opens a saved link: nothing of the app is in memory yet.
      const tab = await page.context().newPage();
      const site = await scriptsOf(tab, `${server.baseUrl}/sites/${siteId}`, () =>
        tab
          .getByRole('link', { name: /^Plot \d+,/ })
          .first()
          .waitFor(),
      );
      expect(site.html).toMatch(/<link rel="modulepreload" crossorigin href="\/assets\/site-/);
      expect(site.scripts.filter((file) => OTHER_PAGES.test(file))).toEqual([]);
      expect(site.scripts.filter((file) => !site.html.includes(`"${file}"`))).toEqual([]);
      // In few files: six for the start-up and three for the page (left to the bundler the page
      // came in 13 small files, each a round trip on a phone's HTTP/1.1 connections).
      expect(site.scripts.length).toBeLessThanOrEqual(10);
      // The first block is built first and the others a moment later: in the end every strip is
      // listed, each once, in plot order.
      const strips = await (
        await tab.request.get(`${server.baseUrl}/api/sites/${siteId}/strips`)
      ).json();
      const plots = (strips.strips as { plotNumber: number }[])
        .map((strip) => `Plot ${strip.plotNumber},`)
        .sort();
      const links = tab.getByRole('link', { name: /^Plot \d+,/ });
      await expect.poll(() => links.count()).toBe(plots.length);
      const names = await links.evaluateAll((all) =>
        all.map((link) => /^Plot \d+,/.exec(link.getAttribute('aria-label') ?? '')?.[0]),
      );
      expect(names).toEqual(plots);
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('keeps the phone’s font on a first visit and uses the web font once the app is on the phone', async () => {
    const { page, errors, close } = await openPage(browser, 390, { serviceWorkers: 'allow' });
    const fontFile = /\/assets\/inter-latin-wght-normal-[\w-]+\.woff2$/;
    // The statuses of the page's Inter faces: none until its @font-face rules are added.
    const interFaces = () =>
      page.evaluate(() =>
        [...document.fonts].filter((face) => face.family.includes('Inter')).map((f) => f.status),
      );
    try {
      // The page asks for the font only through a style sheet; the service worker fetches it on
      // its own (its precache), which the page's resource timing does not list.
      const pageAskedForFont = () =>
        page.evaluate(
          (source) =>
            performance
              .getEntriesByType('resource')
              .some((entry) => new RegExp(source).test(new URL(entry.name).pathname)),
          fontFile.source,
        );
      await page.goto(`${server.baseUrl}/sign-in`);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      // The service worker installs and keeps the app, fonts included.
      await page.evaluate(async () => {
        await navigator.serviceWorker.ready;
      });
      const kept = await page.evaluate(async (source) => {
        const names = await caches.keys();
        for (const name of names)
          for (const request of await (await caches.open(name)).keys())
            if (new RegExp(source).test(new URL(request.url).pathname)) return true;
        return false;
      }, fontFile.source);
      expect(kept).toBe(true);
      expect(await pageAskedForFont()).toBe(false);
      expect(await interFaces()).toEqual([]);

      // The next start, with the worker in control: the text shows in Sheaf's own typeface.
      await page.reload();
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      await expect.poll(pageAskedForFont).toBe(true);
      await expect.poll(interFaces).toContain('loaded');
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('shows a loading view that paints, is named for screen readers and has no words, until the page shows', async () => {
    const { page, errors, close } = await openPage(browser, 390);
    try {
      // The app's file is slow to arrive, as over a weak signal.
      let release = () => {};
      const held = new Promise<void>((resolve) => (release = resolve));
      await page.route('**/assets/app-*.js', async (route) => {
        await held;
        await route.continue();
      });
      await page.goto(`${server.baseUrl}/sign-in`);
      await page.getByRole('status', { name: 'Opening Sheaf…' }).waitFor();
      const paints = () =>
        page.evaluate(() => performance.getEntriesByType('paint').map((entry) => entry.name));
      // The ring has painted, but nothing the browser counts as content: the first contentful
      // paint is the page itself, so blocking time is counted from when there is something to tap.
      await expect.poll(paints).toContain('first-paint');
      expect(await paints()).not.toContain('first-contentful-paint');
      expect(await page.locator('#root').innerText()).toBe('');

      release();
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      await expect.poll(paints).toContain('first-contentful-paint');
      expect(await page.getByRole('status', { name: 'Opening Sheaf…' }).count()).toBe(0);
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('says the app could not load, instead of its loading view, when the app’s file does not arrive', async () => {
    const { page, close } = await openPage(browser, 390);
    try {
      // The signal drops after the page and the entry code have arrived.
      await page.route('**/assets/app-*.js', (route) => route.abort('internetdisconnected'));
      await page.goto(`${server.baseUrl}/sign-in`);
      await expect
        .poll(() => page.getByRole('alert').textContent())
        .toContain('Sheaf could not load all of its files');
      expect(await page.getByRole('status', { name: 'Opening Sheaf…' }).count()).toBe(0);
    } finally {
      await close();
    }
  });
});
