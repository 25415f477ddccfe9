// The web client's rough edges, looked at in Chromium at 390 and 1280 px, and the reports
// printed from the browser on Letter and A4 (every column, no buttons, one section a page).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, demoIds, signIn } from '../helpers/app';
import { buildCollectSite, type CollectSite } from '../api/strips/collect-builders';
import { buildReportTrial, rcbdStrips } from '../api/reports/build-report-trial';
import {
  ARTIFACTS,
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';

const COORDINATOR = 'coordinator@millbrook.example';

describe('the web client as a house to live in', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let ids: Awaited<ReturnType<typeof demoIds>>;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    ids = await demoIds(server.testApp.dataSource);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  /** One invented metric trial with a randomized site, built on first use. */
  let metric: Promise<{ site: CollectSite; coordinator: string }> | null = null;
  const metricTrial = () =>
    (metric ??= buildNetwork(server.testApp.dataSource, 'House metric').then(async (net) => ({
      site: await buildCollectSite(server.testApp.dataSource, net, {
        unitSystem: 'metric',
        fieldName: 'Invented metric field',
      }),
      coordinator: net.emails.coordinator,
    })));

  const pageWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

  async function waitForCharts(page: Page, atLeast: number) {
    await page.waitForFunction(
      (n) => document.querySelectorAll('[data-chart][data-state="ready"] svg').length >= n,
      atLeast,
      { timeout: 20_000 },
    );
  }

  for (const width of [390, 1280]) {
    it(`keeps the wizard's crop message plain, inside the page and gone once a crop is chosen at ${width} px`, async () => {
      const { page, close, errors } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/trials/new`);
      await page.getByLabel(/Trial name/).fill('Invented rough-edge trial');
      await page.getByRole('button', { name: 'Save and continue' }).click();
      const cropError = page.locator('[id$="-error"]', { hasText: 'Choose a crop' });
      await cropError.waitFor();
      expect(await page.getByText(/Invalid option/).count()).toBe(0);
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      // Focus moves to the first field in error, not the button.
      expect(await page.evaluate(() => document.activeElement?.tagName)).toBe('SELECT');
      await screenshot(page, `house-wizard-crop-${width}`);
      await page.getByLabel('Crop').selectOption('oats');
      await cropError.waitFor({ state: 'detached' });
      expect(errors).toEqual([]);
      await close();
    }, 120_000);

    it(`says "Enter a number" for letters and marks fixed fields as fixed at ${width} px`, async () => {
      const { page, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      // The demo oat trial has randomized sites, so its rate levels are fixed.
      await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}/edit?step=1`);
      await page.getByRole('heading', { name: /Step 2 of 5/ }).waitFor();
      const rate = page.getByLabel(/Reference \(full\) rate/);
      await rate.fill('lots');
      await page.getByRole('button', { name: 'Save and continue' }).click();
      await page.getByText('Enter a number').waitFor();
      expect(await page.getByText('Fill this in').count()).toBe(0);
      const level = page.getByLabel(/Level 1: times the full rate/);
      expect(await level.isDisabled()).toBe(true);
      const look = (el: Element) => {
        const style = getComputedStyle(el);
        return `${style.backgroundColor} ${style.borderStyle}`;
      };
      expect(await level.evaluate(look)).not.toBe(await rate.evaluate(look));
      expect(await page.getByText('(fixed)').count()).toBeGreaterThan(0);
      expect(await page.getByText('×', { exact: true }).count()).toBe(0);
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      await screenshot(page, `house-wizard-fixed-${width}`);
      await close();
    }, 120_000);

    it(`shows no error on /calibrate before anything is typed at ${width} px`, async () => {
      const { page, close } = await openPage(browser, width);
      await page.goto(`${server.baseUrl}/calibrate`);
      await page.getByLabel('Seeds counted').waitFor();
      expect(await page.locator('[aria-invalid="true"]').count()).toBe(0);
      await page.getByLabel('Seeds counted').fill('12x');
      await page.getByText('Enter a number').waitFor();
      await screenshot(page, `house-calibrate-${width}`);
      await close();
    }, 120_000);

    it(`fits the invitation's join button text inside the button at ${width} px`, async () => {
      const net = await buildNetwork(
        server.testApp.dataSource,
        'Invented Upper Millbrook Valley Heritage Grain Growers Circle',
      );
      const coordinator = await signIn(server.testApp.app, net.emails.coordinator);
      const invitee = `join-${width}-${net.suffix}@test.example`;
      const sent = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
        email: invitee,
        role: 'grower',
      });
      expect(sent.status).toBe(201);
      const mail = await server.testApp.mailCatcher.waitFor((m) => m.to.includes(invitee));
      const link = /https?:\/\/\S+\/invite\/[\w-]+/.exec(mail.text)?.[0];
      expect(link).toBeTruthy();
      const { page, close } = await openPage(browser, width);
      await page.goto(`${server.baseUrl}${new URL(link!).pathname}`);
      const join = page.getByRole('button', { name: /Join/ });
      await join.waitFor();
      const fits = await join.evaluate((b) => b.scrollWidth <= b.clientWidth + 1);
      expect(fits).toBe(true);
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      await screenshot(page, `house-invitation-${width}`);
      await close();
    }, 120_000);

    it(`shows the same seed grams on the packet map and the weighing table, and a layout code at ${width} px`, async () => {
      const { page, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/packet`);
      await page.getByRole('heading', { name: '1. Strip map' }).waitFor();
      const mapGrams = await page.$$eval('.strip-map svg g[data-rate] text', (nodes) =>
        nodes.map((n) => n.textContent ?? '').filter((t) => t.endsWith(' g')),
      );
      const tableGrams = await page.$$eval('#seed tbody tr td:nth-child(6)', (cells) =>
        cells.map((c) => c.textContent ?? ''),
      );
      expect(mapGrams.length).toBeGreaterThan(0);
      expect(mapGrams).toEqual(tableGrams);
      await page.getByText(/Layout code/).waitFor();
      expect(await page.getByText(/Seed “/).count()).toBe(0);
      await screenshot(page, `house-packet-${width}`);
      await close();
    }, 120_000);

    it(`speaks metric throughout a metric trial's packet: seeder check, counting and sheet at ${width} px`, async () => {
      const { site, coordinator } = await metricTrial();
      const { page, close, errors } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, coordinator);
      await page.goto(`${server.baseUrl}/sites/${site.siteId}/packet`);
      await page.getByTestId('calibration-table').waitFor();
      const packet = page.locator('article.field-packet');
      const text = (await packet.innerText()).replace(/\s+/g, ' ');
      for (const words of [
        'strips of 4 rows at 20.3 cm, 15.2 m long',
        'Seeds / m of row',
        'measure the distance, in metres',
        'seeds per metre of row × circumference (m)',
        'Per turn of a 1 m wheel',
        'Seeds / m²',
        'Use a 1 m stick',
        'Plants along 1 m of row',
        'Plants/m² = count in 1 m × 100 ÷ row spacing in cm',
        'Heads along 1 m of row',
        'weigh in kg',
        'Plants expected in 1 m of row',
        'plants per 1 m of row',
        'Threshed grain weight (kg)',
      ])
        expect(text, words).toContain(words);
      expect(text).not.toMatch(/\bft\b|\bfeet\b|\bfoot\b|\binch|\blb\b|bu\/|\bacre/);
      const full = page.getByTestId('calibration-table').locator('tr', { hasText: 'full ×1' });
      const cells = await full.locator('td').allInnerTexts();
      // Source: NIST SP 811 (2008), Appendix B.8 (1 lb = 0.453 592 37 kg, 1 ft = 0.3048 m) and
      // NIST Handbook 44 (2023), Appendix C (1 acre = 43,560 ft²). By hand: 90 lb/acre ×
      // 1.120 851 = 100.9 kg/ha; 90 × 453.592 37 g ÷ 0.032 g per seed ÷ 43,560 ft² = 29.29
      // seeds/ft², × 8/12 ft of row spacing = 19.52 seeds/ft, ÷ 0.3048 = 64.1 seeds per metre.
      expect(cells.slice(1, 2)).toEqual(['100.9']);
      expect(cells.slice(3, 4)).toEqual(['64.1']);
      // The weighing table gives the same seeds per metre of row as the seeder check.
      const seedRow = page.locator('#seed tbody tr', { hasText: 'full ×1' }).first();
      expect(await seedRow.locator('td').nth(4).innerText()).toBe('64.1');
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      await page.locator('#calibrate').scrollIntoViewIfNeeded();
      await screenshot(page, `house-packet-metric-${width}`);
      expect(errors).toEqual([]);
      await close();
    }, 120_000);

    it(`shows prices with cents and counts without "(s)" on the trial page at ${width} px`, async () => {
      const { page, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}`);
      const prices = page.getByText(/^seed \$/);
      await prices.waitFor();
      expect(await prices.textContent()).toMatch(/^seed \$\d+\.\d\d\/lb, grain \$\d+\.\d\d\/bu$/);
      expect(await page.getByText(/\(s\)/).count()).toBe(0);
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      await close();
    }, 120_000);

    it(`draws the heat map the way round the packet map is and fits the charts to ${width} px`, async () => {
      const { page, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/report`);
      await waitForCharts(page, 3);
      // Blocks run down the heat map, as on the packet map: its axis lists block 1's strips first.
      const labels = await page.$$eval('[data-chart="strip-map"] svg text', (nodes) =>
        nodes.map((n) => n.textContent ?? '').filter((t) => /^Block \d+ · strip \d+$/.test(t)),
      );
      expect(labels[0]).toBe('Block 1 · strip 1');
      expect(labels.indexOf('Block 2 · strip 1')).toBeGreaterThan(
        labels.indexOf('Block 1 · strip 1'),
      );
      const widths = await page.$$eval('[data-chart] svg', (svgs) =>
        svgs.map((svg) => svg.getBoundingClientRect().right),
      );
      for (const right of widths) expect(right).toBeLessThanOrEqual(width);
      expect(await pageWidth(page)).toBeLessThanOrEqual(width);
      await screenshot(page, `house-site-report-${width}`);
      await close();
    }, 120_000);
  }

  it('grows the component chart with a wider window', async () => {
    const { page, close } = await openPage(browser, 900);
    await signInThroughUi(page, server.baseUrl, COORDINATOR);
    await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/report`);
    await waitForCharts(page, 3);
    const measure = () =>
      page.$eval('[data-chart="yield-components"] svg', (svg) => svg.getBoundingClientRect().width);
    const narrow = await measure();
    await page.setViewportSize({ width: 1600, height: 900 });
    await page.waitForFunction(
      (before) =>
        (document.querySelector('[data-chart="yield-components"] svg')?.getBoundingClientRect()
          .width ?? 0) >
        before + 100,
      narrow,
      { timeout: 10_000 },
    );
    expect(await measure()).toBeGreaterThan(narrow + 100);
    await close();
  });

  it('shows a metric trial’s site and network reports per m², per kg and per tonne at 390 and 1280 px', async () => {
    const net = await buildNetwork(server.testApp.dataSource, 'House metric reports');
    // Yields built in kg/ha (the report gives t/ha), with a small site-by-strip wobble so site ×
    // rate is not zero.
    const site = (fieldName: string, shift: number, index: number) => ({
      fieldName,
      strips: rcbdStrips(
        [
          [3000, 3500, 3700, 3750],
          [3100, 3600, 3650, 3700],
          [2950, 3450, 3750, 3650],
          [3050, 3550, 3700, 3800],
        ].map((row, b) =>
          row.map((v, level) => v + shift + (((b * 3 + level * (7 + index)) % 5) - 2) * 40),
        ),
      ),
    });
    const built = await buildReportTrial(server.testApp.dataSource, net, {
      unitSystem: 'metric',
      referenceRate: 120,
      referenceUnit: 'kg/ha',
      sites: [
        site('Invented metric north', 0, 0),
        site('Invented metric creek', 300, 1),
        site('Invented metric hill', -200, 2),
      ],
    });
    const imperialWords =
      /ft²|\bft\b|\bfeet\b|\binch|\/lb\b|\/bu\b|lb\/acre|bu\/acre|per acre|\/acre/;
    const { page, close, errors } = await openPage(browser, 390);
    await signInThroughUi(page, server.baseUrl, net.emails.coordinator);
    await page.goto(`${server.baseUrl}/sites/${built.siteIds[0]}/report`);
    const parts = page.getByRole('region', { name: /Yield components and seed economics/ });
    await parts.waitFor();
    const partsText = await parts.innerText();
    expect(partsText).toContain('Plants/m²');
    expect(partsText).toContain('Heads/m²');
    // Source: PSU-WS (shared/TRADE_FACTS.md: plants per area = count ÷ (row length × row
    // spacing)) and NIST SP 811 (1 in = 2.54 cm): stand counts 30 + 32 + 28 on three 3 m lengths
    // of 7.5-in (0.1905 m) rows are 90 ÷ (9 × 0.1905) = 52.5 plants/m²; heads 70 + 66 on two
    // 3 m lengths are 136 ÷ (6 × 0.1905) = 119.0 heads/m².
    const full = await parts.locator('tr', { hasText: 'full' }).locator('td').allInnerTexts();
    expect(full.slice(1, 2)).toEqual(['52']);
    expect(full.slice(4, 5)).toEqual(['119']);
    // Yield in t/ha, two decimals. Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t =
    // 1000 kg; the full rate's strips at the north site are 3,780, 3,650, 3,670 and 3,740 kg/ha
    // (base plus wobble above), mean 3,710 kg/ha = 3.71 t/ha.
    expect(partsText).toContain('Yield (t/ha)');
    expect(full).toContain('3.71');
    await waitForCharts(page, 3);
    expect((await page.locator('main').innerText()).match(imperialWords)).toBeNull();
    await screenshot(page, 'house-site-report-metric-390');
    await page.setViewportSize({ width: 1280, height: 900 });
    await screenshot(page, 'house-site-report-metric-1280');

    await page.goto(`${server.baseUrl}/trials/${built.trialId}/report`);
    const seedPrice = page.getByRole('textbox', { name: 'Seed price' });
    await seedPrice.waitFor();
    // Source: NIST SP 811 (2008), Appendix B.8 (1 lb = 0.453 592 37 kg) and the USDA 60-lb
    // wheat bushel (shared/TRADE_FACTS.md §3): the trial's $0.50/lb is $1.102/kg and its
    // $8.00/bu is $293.95/t (the box shows four figures).
    expect(await seedPrice.inputValue()).toBe('1.102');
    expect(await page.getByRole('textbox', { name: 'Grain price' }).inputValue()).toBe('293.9');
    await waitForCharts(page, 3);
    const pooledText = await page.locator('main').innerText();
    expect(pooledText).toContain('Economics per hectare');
    expect(pooledText).toContain('seed $1.10/kg, grain $293.95/t');
    expect(pooledText).toContain('Yield (t/ha)');
    expect(pooledText).not.toMatch(/Yield \(kg\/ha\)/);
    expect(pooledText.match(imperialWords)).toBeNull();
    await screenshot(page, 'house-pooled-report-metric-1280');
    // A price typed per kg comes back as the same price per kg (sent to the API per lb).
    await seedPrice.fill('2');
    await page.getByRole('button', { name: 'Recalculate' }).click();
    await page.getByText('seed $2.00/kg, grain $293.95/t').first().waitFor();
    await page.setViewportSize({ width: 390, height: 844 });
    await screenshot(page, 'house-pooled-report-metric-390');
    expect(errors).toEqual([]);
    await close();
  }, 120_000);

  /** Prints the page to PDF and returns its page count and text (poppler's pdfinfo/pdftotext). */
  async function printToPdf(page: Page, name: string, format: 'Letter' | 'A4') {
    fs.mkdirSync(ARTIFACTS, { recursive: true });
    const file = path.join(ARTIFACTS, `${name}-${format}.pdf`);
    await page.emulateMedia({ media: 'print' });
    await page.pdf({ path: file, format, printBackground: true });
    const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
    const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    return { pages, text };
  }

  for (const format of ['Letter', 'A4'] as const) {
    it(`prints the site report on ${format} with every column, no buttons and a page per section`, async () => {
      const { page, close } = await openPage(browser, 1280);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/report`);
      await waitForCharts(page, 3);
      const { pages, text } = await printToPdf(page, 'house-site-report', format);
      // The widest table's last column ("Return over seed (…)") is on paper, not cut off.
      expect(text).toContain('Return over seed');
      expect(text).not.toMatch(/\bPrint\b|Unpublish|Publish the/);
      // Header and facts, charts, numbers, checks or notes: each section starts a page.
      const sections = await page.locator('.report-section').count();
      expect(pages).toBeGreaterThanOrEqual(sections);
      expect(pages).toBeLessThanOrEqual(sections + 4);
      await close();
    });

    it(`prints the pooled report on ${format} with every column, no buttons and a page per section`, async () => {
      const { page, close } = await openPage(browser, 1280);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}/report`);
      await waitForCharts(page, 3);
      const { pages, text } = await printToPdf(page, 'house-pooled-report', format);
      // The economics table's last column names the reference rate.
      expect(text).toMatch(/Versus \w+/);
      expect(text).not.toMatch(/Recalculate|Turn the link|Meeting view/);
      const sections = await page.locator('.report-section').count();
      expect(pages).toBeGreaterThanOrEqual(sections);
      expect(pages).toBeLessThanOrEqual(sections + 4);
      await close();
    });
  }
});
