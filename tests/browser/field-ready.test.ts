// Ready for the field: dates that never shift west or east of UTC, honest save state, one number
// parser, a grid that is one Tab stop, a private queue per person, and the app opening without signal.
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page, Request } from 'playwright-core';
import { buildNetwork, type BuiltNetwork } from '../helpers/app';
import {
  expectAccessible,
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildCollectSite, type CollectSite } from '../api/strips/collect-builders';

const PHONE = 390;

/** A raw GET, so the test sees the encoding and cache headers exactly as the server sent them. */
function rawGet(url: string, headers: Record<string, string> = {}) {
  return new Promise<http.IncomingMessage>((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        res.resume();
        resolve(res);
      })
      .on('error', reject);
  });
}

describe('ready for the field', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let net: BuiltNetwork;
  let site: CollectSite;

  const observation = async (stripId: string) =>
    (
      await server.testApp.dataSource.query('SELECT * FROM observations WHERE strip_id = $1', [
        stripId,
      ])
    )[0];
  const status = (page: Page) => page.getByTestId('outbox-status');
  const waitSaved = (page: Page) =>
    status(page).filter({ hasText: 'All changes saved' }).waitFor({ timeout: 20_000 });

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    net = await buildNetwork(server.testApp.dataSource, 'Field ready');
    site = await buildCollectSite(server.testApp.dataSource, net, { fieldName: 'Creek field' });
    await server.testApp.dataSource.query(
      `UPDATE sites SET sowing_date = '2027-04-15' WHERE id = $1`,
      [site.siteId],
    );
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it.each(['America/Chicago', 'Pacific/Auckland'])(
    'shows the sowing date as 2027-04-15 in %s on the site page, the site report and the progress table, and saves a date unshifted',
    async (timezoneId) => {
      const { page, errors, close } = await openPage(browser, 1280, { timezoneId });
      try {
        await signInThroughUi(page, server.baseUrl, net.emails.coordinator);
        await page.goto(`${server.baseUrl}/sites/${site.siteId}`);
        expect(await page.evaluate(() => Intl.DateTimeFormat().resolvedOptions().timeZone)).toBe(
          timezoneId,
        );
        // Read as text, and in the date box once the dates are opened for changing.
        const dates = page.getByRole('form', { name: 'Site dates' });
        await dates.getByText('Apr 15, 2027').waitFor();
        expect(await dates.getByText('Apr 14, 2027').count()).toBe(0);
        // No date box until someone asks to change the dates; then the first takes the focus.
        expect(await dates.locator('input[type="date"]').count()).toBe(0);
        await dates.getByRole('button', { name: 'Change dates' }).click();
        const sowing = dates.getByLabel('Sowing', { exact: true });
        await expect
          .poll(() => sowing.evaluate((box) => box === document.activeElement))
          .toBe(true);
        expect(await sowing.inputValue()).toBe('2027-04-15');
        // A date saved here is stored with the same digits, and read back as text.
        const heading = timezoneId === 'America/Chicago' ? '2027-06-20' : '2027-06-21';
        await dates.getByLabel('Heading', { exact: true }).fill(heading);
        await dates.getByRole('button', { name: 'Save dates' }).click();
        await dates.getByText(`Jun ${heading.slice(-2)}, 2027`).waitFor();
        expect(await dates.locator('input[type="date"]').count()).toBe(0);
        const [row] = await server.testApp.dataSource.query(
          `SELECT to_char(heading_date, 'YYYY-MM-DD') AS heading FROM sites WHERE id = $1`,
          [site.siteId],
        );
        expect(row.heading).toBe(heading);
        await page.goto(`${server.baseUrl}/sites/${site.siteId}/report`);
        await page.getByText('Apr 15, 2027').first().waitFor();
        expect(await page.getByText('Apr 14, 2027').count()).toBe(0);
        expect(await page.getByText('Apr 16, 2027').count()).toBe(0);
        await page.goto(`${server.baseUrl}/trials/${site.trialId}/progress`);
        await page.getByTestId('progress-table').waitFor();
        expect(await page.getByTestId('progress-table').textContent()).toContain('Apr 15, 2027');
        await expectAccessible(page);
        expect(errors).toEqual([]);
      } finally {
        await close();
      }
    },
  );

  it('says which box is not saved and why, reads a decimal comma, and asks before leaving', async () => {
    const strip = site.strips[1]!;
    const { page, errors, close } = await openPage(browser, PHONE);
    try {
      await signInThroughUi(page, server.baseUrl, net.emails.grower);
      await page.goto(`${server.baseUrl}/sites/${site.siteId}/strips/${strip.id}`);
      await page.getByRole('heading', { name: 'Plot 102' }).waitFor();
      await waitSaved(page);

      await page.getByLabel('Moisture').fill('12,5');
      await waitSaved(page);
      expect(Number((await observation(strip.id)).moisture_pct)).toBe(12.5);

      const count = page.getByLabel('Count 1', { exact: true }).first();
      await count.fill('abc');
      await page.getByText('Not saved: Enter a number').waitFor();
      await page.getByLabel('Grain weight').fill('1,234');
      await page
        .getByText('Not saved: Write 1234 or 1234.5, without thousands separators')
        .waitFor();
      await count.fill('12.5');
      await page.getByText('Not saved: Use a whole number').waitFor();
      await status(page).filter({ hasText: '2 boxes not saved' }).waitFor();
      expect(await status(page).textContent()).not.toContain('All changes saved');
      await screenshot(page, 'field-not-saved-390');

      // Moving to another strip and back keeps the text that was not saved, and says so.
      await page.getByRole('link', { name: /Plot 103/ }).click();
      await page.getByRole('heading', { name: 'Plot 103' }).waitFor();
      await status(page).filter({ hasText: '2 boxes not saved' }).waitFor();
      await page.getByRole('link', { name: /Plot 102/ }).click();
      await page.getByRole('heading', { name: 'Plot 102' }).waitFor();
      expect(await count.inputValue()).toBe('12.5');

      const dialog = page.waitForEvent('dialog');
      await page.close({ runBeforeUnload: true });
      const asked = await dialog;
      expect(asked.type()).toBe('beforeunload');
      await asked.accept();
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('makes the grid one Tab stop with arrow keys inside', async () => {
    const { page, errors, close } = await openPage(browser, 1280);
    try {
      await signInThroughUi(page, server.baseUrl, net.emails.grower);
      await page.goto(`${server.baseUrl}/sites/${site.siteId}/grid`);
      const grid = page.getByTestId('strip-grid');
      await grid.waitFor();
      expect(await grid.locator('input[tabindex="0"]').count()).toBe(1);
      expect(await grid.locator('input').count()).toBeGreaterThan(100);
      const active = () =>
        page.evaluate(() => document.activeElement?.getAttribute('data-cell') ?? null);
      // Tab into the grid from the control just before it, then arrows, then Tab out.
      await grid.locator('[data-cell="0:0"]').focus();
      await page.keyboard.press('ArrowRight');
      await page.keyboard.press('ArrowDown');
      expect(await active()).toBe('1:1');
      await page.keyboard.press('Tab');
      expect(await active()).toBeNull();
      await page.keyboard.press('Shift+Tab');
      expect(await active()).toBe('1:1');
      expect(await grid.locator('input[tabindex="0"]').count()).toBe(1);
      await expectAccessible(page);
      await screenshot(page, 'field-grid-1280');
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('keeps unsent changes when the page closes, and hides them from the next person on the phone', async () => {
    const strip = site.strips[2]!;
    const phone = await openPage(browser, PHONE, { serviceWorkers: 'block' });
    const { context } = phone;
    const patches: Request[] = [];
    context.on('request', (request) => {
      if (request.method() === 'PATCH' && request.url().includes('/api/strips/'))
        patches.push(request);
    });
    // The server refuses nothing: the connection to it fails, as in a field without signal.
    await context.route('**/api/strips/**', (route) =>
      route.request().method() === 'PATCH' ? route.abort('internetdisconnected') : route.continue(),
    );
    try {
      const page = phone.page;
      await signInThroughUi(page, server.baseUrl, net.emails.grower);
      await page.goto(`${server.baseUrl}/sites/${site.siteId}/strips/${strip.id}`);
      await page.getByLabel('Test weight').fill('39.5');
      await status(page).filter({ hasText: '1 change waiting' }).waitFor();
      await page.close();

      // The browser comes back: the change is still there.
      const again = await context.newPage();
      await again.goto(`${server.baseUrl}/sites/${site.siteId}`);
      await status(again).filter({ hasText: '1 change waiting' }).waitFor();

      // Someone else signs in on the same phone (the grower's session has ended).
      await context.clearCookies();
      await signInThroughUi(again, server.baseUrl, net.emails.coordinator);
      const sentBefore = patches.length;
      await again.goto(`${server.baseUrl}/sites/${site.siteId}`);
      await waitSaved(again);
      await again.waitForTimeout(1500);
      expect(patches.length).toBe(sentBefore);
      await screenshot(again, 'field-queue-other-person-390');

      // The grower signs in again: their change is waiting, and goes once there is signal.
      await context.clearCookies();
      await signInThroughUi(again, server.baseUrl, net.emails.grower);
      await again.goto(`${server.baseUrl}/sites/${site.siteId}`);
      await status(again).filter({ hasText: '1 change waiting' }).waitFor();
      await context.unroute('**/api/strips/**');
      await waitSaved(again);
      expect(Number((await observation(strip.id)).test_weight)).toBe(39.5);
    } finally {
      await phone.close();
    }
  });

  it('opens the site with no signal from the installed app and sends an entry made offline', async () => {
    const strip = site.strips[3]!;
    const plot = `Plot ${strip.block * 100 + strip.position}`;
    await server.testApp.dataSource.query(
      `INSERT INTO observations (strip_id, moisture_pct) VALUES ($1, 13.7)
       ON CONFLICT (strip_id) DO UPDATE SET moisture_pct = 13.7`,
      [strip.id],
    );
    const phone = await openPage(browser, PHONE, { serviceWorkers: 'allow' });
    const { context } = phone;
    try {
      const page = phone.page;
      await signInThroughUi(page, server.baseUrl, net.emails.grower);
      const manifest = await page.evaluate(async () =>
        (await fetch('/manifest.webmanifest')).json(),
      );
      expect(manifest.name).toMatch(/Sheaf/);
      expect(manifest.icons.map((i: { sizes: string }) => i.sizes)).toContain('512x512');
      await page.goto(`${server.baseUrl}/sites/${site.siteId}`);
      await page.evaluate(async () => {
        await navigator.serviceWorker.ready;
      });
      // Open the site once with the service worker in control: that visit is what it keeps.
      await page.reload();
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
      await page.getByRole('link', { name: new RegExp(`^${plot},`) }).waitFor();
      await page.waitForLoadState('networkidle');

      await context.setOffline(true);
      await page.close();
      const offline = await context.newPage();
      await offline.goto(`${server.baseUrl}/sites/${site.siteId}`);
      // Truly without signal: a request the service worker does not keep fails.
      expect(
        await offline.evaluate(() =>
          fetch('/api/health').then(
            () => 'reached',
            () => 'failed',
          ),
        ),
      ).toBe('failed');
      await offline.getByRole('heading', { name: 'Creek field' }).waitFor();
      await offline.getByRole('link', { name: new RegExp(`^${plot},`) }).click();
      await offline.getByRole('heading', { name: plot }).waitFor();
      // The last synced value is shown.
      expect(await offline.getByLabel('Moisture').inputValue()).toBe('13.7');
      await offline.getByLabel('Moisture').fill('14.1');
      await status(offline).filter({ hasText: '1 change waiting' }).waitFor();
      await screenshot(offline, 'field-offline-open-390');

      await context.setOffline(false);
      await offline.evaluate(() => window.dispatchEvent(new Event('online')));
      await waitSaved(offline);
      expect(Number((await observation(strip.id)).moisture_pct)).toBe(14.1);
    } finally {
      await context.setOffline(false);
      await phone.close();
    }
  });

  it('sends text assets compressed, hashed assets immutable, and the service worker uncached', async () => {
    const html = await (await fetch(`${server.baseUrl}/sign-in`)).text();
    const script = /src="(\/assets\/index-[^"]+\.js)"/.exec(html)?.[1];
    expect(script).toBeDefined();
    const brotli = await rawGet(`${server.baseUrl}${script}`, { 'accept-encoding': 'gzip, br' });
    expect(brotli.headers['content-encoding']).toBe('br');
    expect(brotli.headers['content-type']).toMatch(/javascript/);
    expect(brotli.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(brotli.headers.vary).toMatch(/Accept-Encoding/);
    const gzip = await rawGet(`${server.baseUrl}${script}`, { 'accept-encoding': 'gzip' });
    expect(gzip.headers['content-encoding']).toBe('gzip');
    const plain = await rawGet(`${server.baseUrl}${script}`);
    expect(plain.headers['content-encoding']).toBeUndefined();
    const worker = await rawGet(`${server.baseUrl}/sw.js`, { 'accept-encoding': 'br' });
    expect(worker.headers['cache-control']).toBe('no-cache');
  });
});
