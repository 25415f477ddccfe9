// Collecting numbers on a 390 px phone: strip entry with live derived yield, offline queueing,
// nothing lost on reload, conflict handling, escaped notes; plus grid and progress pages.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { buildNetwork, type BuiltNetwork } from '../helpers/app';
import {
  CONTEXT_DEFAULTS,
  launchBrowser,
  screenshot,
  signInThroughUi,
  startTestServer,
  watchErrors,
} from '../helpers/browser';
import { buildCollectSite, type CollectSite } from '../api/strips/collect-builders';

const PHONE = { width: 390, height: 844 };

describe('collecting strip data in the browser', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let net: BuiltNetwork;
  let site: CollectSite;
  let context: BrowserContext;
  let page: Page;
  let errors: string[];

  const observation = async (stripId: string) =>
    (
      await server.testApp.dataSource.query('SELECT * FROM observations WHERE strip_id = $1', [
        stripId,
      ])
    )[0];
  /** What the strip sends did, so a failure says why rather than only that it timed out. */
  const sends: string[] = [];
  const explained = async (p: Page, wait: Promise<void>) => {
    try {
      await wait;
    } catch (error) {
      const status = await p
        .getByTestId('outbox-status')
        .textContent({ timeout: 1000 })
        .catch(() => '(no status)');
      throw new Error(
        `${String(error)}\nThe page says: ${status}\nStrip sends:\n${sends.slice(-12).join('\n')}`,
      );
    }
  };
  const waitSaved = (p: Page) =>
    explained(
      p,
      p
        .getByTestId('outbox-status')
        .filter({ hasText: 'All changes saved' })
        .waitFor({ timeout: 15_000 }),
    );

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    net = await buildNetwork(server.testApp.dataSource, 'Browser collect');
    site = await buildCollectSite(server.testApp.dataSource, net, { fieldName: 'Ridge field' });
    context = await browser.newContext({
      viewport: PHONE,
      deviceScaleFactor: 1,
      ...CONTEXT_DEFAULTS,
    });
    page = await context.newPage();
    errors = watchErrors(page);
    page.on('requestfinished', (request) => {
      if (request.method() !== 'PATCH') return;
      void request.response().then((response) => {
        sends.push(`${new Date().toISOString()} PATCH ${response?.status() ?? '?'}`);
      });
    });
    page.on('requestfailed', (request) => {
      if (request.method() === 'PATCH')
        sends.push(`${new Date().toISOString()} PATCH failed: ${request.failure()?.errorText}`);
    });
    page.on('request', (request) => {
      if (request.method() === 'PATCH') sends.push(`${new Date().toISOString()} PATCH sent`);
    });
    await signInThroughUi(page, server.baseUrl, net.emails.grower);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('lists the strips of the site with what is missing', async () => {
    await page.goto(`${server.baseUrl}/sites/${site.siteId}`);
    await page.getByRole('heading', { name: 'Ridge field' }).waitFor();
    await expect(page.getByRole('link', { name: /^Plot 101,/ }).count()).resolves.toBe(1);
    // The row's name says what is recorded and what is missing, as its pills show it.
    expect(
      await page
        .getByRole('link', { name: /^Plot 101,.*; stand missing, tillers missing/ })
        .count(),
    ).toBe(1);
    await screenshot(page, 'collect-site-390');
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflow).toBeLessThanOrEqual(0);
  });

  it('enters a stand count and grain weight on the phone form and shows the derived yield', async () => {
    const strip = site.strips[0]!;
    await page.getByRole('link', { name: /^Plot 101,/ }).click();
    await page.getByRole('heading', { name: 'Plot 101' }).waitFor();
    await page.getByLabel('Count 1', { exact: true }).first().fill('44');
    await page.getByLabel('Count 2', { exact: true }).first().fill('46');
    await page.getByLabel('Count 3', { exact: true }).first().fill('45');
    await page.getByLabel('Row length of each count').first().fill('3');
    expect(
      await page.getByLabel('Count 1', { exact: true }).first().getAttribute('inputmode'),
    ).toBe('numeric');
    await expect(page.getByTestId('plants-per-area').textContent()).resolves.toBe('22.5');
    await page.getByLabel('Grain weight').fill('7.4');
    expect(await page.getByLabel('Grain weight').getAttribute('inputmode')).toBe('decimal');
    await page.getByLabel('Rows harvested').fill('4');
    await page.getByLabel('Length harvested').fill('50');
    await page.getByLabel('Moisture').fill('13.2');
    // 135 plants on 3 × 3 ft of 8-inch row: 45 × 4 ÷ 8 = 22.5 plants/ft² [PSU-WS].
    // 7.4 lb at 13.2 % on 4 × 8 in × 50 ft, oats at 14 % and 32 lb/bu → 76.25 bu/acre (see strip-derived.test.ts).
    const yieldText = await page.getByTestId('yield-bu').textContent();
    expect(Number(yieldText)).toBeCloseTo(76.25, 0);
    await waitSaved(page);
    await screenshot(page, 'collect-strip-390');
    const row = await observation(strip.id);
    expect(row.stand_counts).toEqual([44, 46, 45]);
    expect(Number(row.grain_weight)).toBe(7.4);
    expect(Number(row.moisture_pct)).toBe(13.2);
  });

  it('keeps an edit made offline and sends it when the connection returns', async () => {
    const strip = site.strips[0]!;
    await context.setOffline(true);
    try {
      await page.getByLabel('Moisture').fill('14.5');
      await page.getByTestId('outbox-status').filter({ hasText: '1 change waiting' }).waitFor();
      await page.waitForTimeout(1000);
      expect(Number((await observation(strip.id)).moisture_pct)).toBe(13.2);
      await screenshot(page, 'collect-offline-390');
    } finally {
      await context.setOffline(false);
    }
    await waitSaved(page);
    expect(Number((await observation(strip.id)).moisture_pct)).toBe(14.5);
  });

  it('loses nothing typed when the page reloads before the edit was sent', async () => {
    const strip = site.strips[0]!;
    // Sends fail until the flag is lowered. The route stays in place until the edit has arrived:
    // removing it while a send is paused in it would race with that send.
    let failSends = true;
    await page.route('**/api/strips/**', (route) =>
      failSends && route.request().method() === 'PATCH'
        ? route.abort('internetdisconnected')
        : route.continue(),
    );
    await page.getByLabel('Test weight').fill('38.5');
    await page.getByTestId('outbox-status').filter({ hasText: '1 change waiting' }).waitFor();
    await page.reload();
    await page.getByRole('heading', { name: 'Plot 101' }).waitFor();
    // The page may draw the server's values first; the edit appears once the device's queue is read.
    await expect.poll(() => page.getByLabel('Test weight').inputValue()).toBe('38.5');
    await page.getByTestId('outbox-status').filter({ hasText: '1 change waiting' }).waitFor();
    failSends = false;
    // The outbox retries on its own every few seconds.
    await waitSaved(page);
    await page.unroute('**/api/strips/**');
    expect(Number((await observation(strip.id)).test_weight)).toBe(38.5);
  });

  it('offers to reload or overwrite when someone else saved the strip first', async () => {
    const strip = site.strips[0]!;
    // Another person's save, made straight in the database.
    await server.testApp.dataSource.query('UPDATE strips SET version = version + 1 WHERE id = $1', [
      strip.id,
    ]);
    await server.testApp.dataSource.query(
      `UPDATE observations SET notes = 'coordinator checked' WHERE strip_id = $1`,
      [strip.id],
    );
    await page.getByLabel('Plants examined').fill('10');
    await explained(
      page,
      page
        .getByText('Someone else saved this strip after you opened it')
        .waitFor({ timeout: 15_000 }),
    );
    await screenshot(page, 'collect-conflict-390');
    await page.getByRole('button', { name: 'Save mine over theirs' }).click();
    await waitSaved(page);
    const row = await observation(strip.id);
    expect(Number(row.tiller_plants)).toBe(10);
    expect(row.notes).toBe('coordinator checked');
  });

  it('renders HTML typed into notes as text', async () => {
    const strip = site.strips[1]!;
    const notes = `<img src=x onerror="document.body.dataset.hacked='yes'"> =cmd|' /C calc'!A0`;
    await server.testApp.dataSource.query(
      `INSERT INTO observations (strip_id, notes) VALUES ($1, $2)`,
      [strip.id, notes],
    );
    await page.goto(`${server.baseUrl}/sites/${site.siteId}/strips/${strip.id}`);
    await page.getByTestId('saved-notes').waitFor();
    expect(await page.getByTestId('saved-notes').textContent()).toBe(notes);
    expect(await page.locator('img[src="x"]').count()).toBe(0);
    expect(await page.evaluate(() => document.body.dataset.hacked)).toBeUndefined();
  });

  it('previews a CSV with its row errors before upload, and uploads a photo', async () => {
    await page.goto(`${server.baseUrl}/sites/${site.siteId}/import`);
    await page.getByLabel('CSV file (up to 5 MB)').setInputFiles({
      name: 'ridge.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(
        'site,block,position,rate,moisture_pct,notes\nRidge field,1,2,double,wet,<b>bold</b>\nRidge field,1,3,half,13.1,\n',
      ),
    });
    const problems = page.getByTestId('import-errors');
    await problems.waitFor();
    expect(await problems.textContent()).toContain('moisture_pct');
    // The HTML typed in a cell is previewed as text.
    expect(await page.getByTestId('import-preview').locator('b').count()).toBe(0);
    expect(await page.getByRole('button', { name: /Upload ridge\.csv/ }).isDisabled()).toBe(true);
    await screenshot(page, 'collect-import-390');

    await page.goto(`${server.baseUrl}/sites/${site.siteId}/photos`);
    const png = Buffer.from(
      '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f3e3f00000000049454e44ae426082',
      'hex',
    );
    await page
      .getByLabel(/^Photo \(JPEG/)
      .setInputFiles({ name: 'lodging.png', mimeType: 'image/png', buffer: png });
    await page.getByLabel('Caption').fill('Lodging after the storm');
    await page.getByRole('button', { name: 'Upload photo' }).click();
    await page.getByRole('img', { name: 'Lodging after the storm' }).waitFor();
    await screenshot(page, 'collect-photos-390');
  });

  it('shows the grid and the coordinator’s progress page', async () => {
    await page.goto(`${server.baseUrl}/sites/${site.siteId}/grid`);
    await page.getByTestId('strip-grid').waitFor();
    const first = page.locator('[data-cell="1:0"]');
    await first.click();
    await first.fill('51');
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-cell'))).toBe(
      '2:0',
    );
    await screenshot(page, 'collect-grid-390');
    await waitSaved(page);

    const desk = await browser.newContext({
      viewport: { width: 1280, height: 900 },
      ...CONTEXT_DEFAULTS,
    });
    const coordinatorPage = await desk.newPage();
    await signInThroughUi(coordinatorPage, server.baseUrl, net.emails.coordinator);
    await coordinatorPage.goto(`${server.baseUrl}/trials/${site.trialId}/progress`);
    await coordinatorPage.getByTestId('progress-table').waitFor();
    await screenshot(coordinatorPage, 'collect-progress-1280');
    await coordinatorPage.goto(`${server.baseUrl}/sites/${site.siteId}/history`);
    await coordinatorPage.getByTestId('history').waitFor();
    await screenshot(coordinatorPage, 'collect-history-1280');
    await desk.close();
    // Requests failed on purpose while offline are expected; nothing else may go wrong.
    expect(errors.filter((e) => !/ERR_INTERNET_DISCONNECTED/.test(e))).toEqual([]);
  });
});
