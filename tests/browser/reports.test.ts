// Reports in a real browser: site and pooled reports draw their charts at phone and desktop
// widths, the meeting view moves with the arrow keys, the PDF export opens, the public link
// works signed out, and the charting chunk stays off the first page a grower opens.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, demoIds } from '../helpers/app';
import {
  ARTIFACTS,
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildReportTrial, rcbdStrips } from '../api/reports/build-report-trial';

const COORDINATOR = 'coordinator@millbrook.example';

describe('reports in the browser', () => {
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

  /** Waits for every chart on the page to be drawn and checks each SVG has visible marks. */
  async function expectChartsDrawn(page: Page, atLeast: number) {
    await page.waitForFunction(
      (n) => document.querySelectorAll('[data-chart][data-state="ready"] svg').length >= n,
      atLeast,
      { timeout: 20_000 },
    );
    const charts = await page.$$eval('[data-chart][data-state="ready"]', (nodes) =>
      nodes.map((node) => {
        const svg = node.querySelector('svg')!;
        const box = svg.getBoundingClientRect();
        return {
          name: node.getAttribute('data-chart'),
          width: box.width,
          height: box.height,
          marks: svg.querySelectorAll('path, rect, line, circle, text').length,
        };
      }),
    );
    expect(charts.length).toBeGreaterThanOrEqual(atLeast);
    for (const chart of charts) {
      expect(chart.width, chart.name ?? '').toBeGreaterThan(100);
      expect(chart.height, chart.name ?? '').toBeGreaterThan(50);
      expect(chart.marks, chart.name ?? '').toBeGreaterThan(10);
    }
    return charts;
  }

  for (const width of [390, 1280]) {
    it(`draws the site report's charts at ${width} px`, async () => {
      const { page, errors, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/report`);
      await page.getByRole('heading', { name: 'What this means' }).waitFor();
      const charts = await expectChartsDrawn(page, 3);
      expect(charts.map((c) => c.name)).toEqual(
        expect.arrayContaining(['rate-means', 'strip-map', 'yield-components']),
      );
      const overflow = await page.evaluate(
        () => document.documentElement.scrollWidth - window.innerWidth,
      );
      expect(overflow).toBeLessThanOrEqual(1);
      await screenshot(page, `reports-site-${width}`);
      // Plain words first; the test statistics sit under their own heading at the end.
      const findings = await page.locator('#findings-title').locator('..').innerText();
      expect(findings).toMatch(/95 % interval .* Dunnett-adjusted/);
      expect(findings).not.toMatch(/\bF = |\bdf\b|studentized/);
      const statistician = page.getByRole('heading', { name: 'For the statistician' });
      await statistician.scrollIntoViewIfNeeded();
      await page.getByText(/Outlier test \(externally studentized residuals/).waitFor();
      await screenshot(page, `reports-site-statistician-${width}`);
      expect(errors).toEqual([]);
      await close();
    });

    it(`draws the pooled report's charts at ${width} px`, async () => {
      const { page, errors, close } = await openPage(browser, width);
      // Vega logs spec problems (empty layers, clashing scales) as console warnings.
      const chartWarnings: string[] = [];
      page.on('console', (message) => {
        if (message.type() === 'warning' && /WARN/.test(message.text()))
          chartWarnings.push(message.text());
      });
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}/report`);
      await page.getByRole('heading', { name: 'What the network found' }).waitFor();
      const charts = await expectChartsDrawn(page, 3);
      expect(charts.map((c) => c.name)).toEqual(
        expect.arrayContaining(['response-curve', 'network-rate-means']),
      );
      await page.getByText('8 in, 0 left out').waitFor({ state: 'visible', timeout: 15_000 });
      const overflow = await page.evaluate(
        () => document.documentElement.scrollWidth - window.innerWidth,
      );
      expect(overflow).toBeLessThanOrEqual(1);
      await screenshot(page, `reports-pooled-${width}`);
      const mixed = page.getByRole('heading', { name: 'Expected yield at a farm like these' });
      await mixed.scrollIntoViewIfNeeded();
      await page.getByText('all comparisons (Dunnett)').first().waitFor();
      await page.getByRole('heading', { name: 'Does yield level off?' }).waitFor();
      await page.getByRole('heading', { name: 'For the statistician' }).scrollIntoViewIfNeeded();
      await page
        .getByText(/Kenward–Roger\), p/)
        .first()
        .waitFor();
      await screenshot(page, `reports-pooled-mixed-${width}`);
      expect(errors).toEqual([]);
      expect(chartWarnings).toEqual([]);
      await close();
    });
  }

  it('moves through the meeting view with the arrow keys', async () => {
    const { page, errors, close } = await openPage(browser, 1280);
    await signInThroughUi(page, server.baseUrl, COORDINATOR);
    await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}/meeting`);
    const counter = page.getByTestId('slide-counter');
    await counter.waitFor();
    const total = Number((await counter.textContent())!.split('/')[1]);
    expect(total).toBeGreaterThanOrEqual(6);
    expect((await counter.textContent())!.trim()).toBe(`1 / ${total}`);
    await screenshot(page, 'reports-meeting-title');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    expect((await counter.textContent())!.trim()).toBe(`4 / ${total}`);
    await expectChartsDrawn(page, 1);
    await screenshot(page, 'reports-meeting-answer-dark');
    await page.keyboard.press('ArrowRight');
    await expectChartsDrawn(page, 1);
    expect(await page.locator('[data-slide]').getAttribute('data-slide')).toBe('forest');
    await screenshot(page, 'reports-meeting-forest-dark');
    await page.keyboard.press('ArrowLeft');
    expect((await counter.textContent())!.trim()).toBe(`4 / ${total}`);
    await page.keyboard.press('d');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expectChartsDrawn(page, 1);
    await screenshot(page, 'reports-meeting-economics-light');
    await page.keyboard.press('End');
    expect(await page.locator('[data-slide]').getAttribute('data-slide')).toBe('statistician');
    await page.getByText(/Kenward–Roger\), p/).waitFor();
    await screenshot(page, 'reports-meeting-statistician-light');
    expect(errors).toEqual([]);
    await close();
  });

  it('downloads a site report PDF that opens', async () => {
    const { page, close } = await openPage(browser, 1280, { acceptDownloads: true });
    await signInThroughUi(page, server.baseUrl, COORDINATOR);
    await page.goto(`${server.baseUrl}/sites/${ids.sites[1]!.id}/report`);
    await page.getByRole('heading', { name: 'What this means' }).waitFor();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'PDF' }).click(),
    ]);
    fs.mkdirSync(ARTIFACTS, { recursive: true });
    const file = path.join(ARTIFACTS, 'reports-site.pdf');
    await download.saveAs(file);
    const info = execFileSync('/usr/bin/pdfinfo', [file], { encoding: 'utf8' });
    expect(Number(/Pages:\s+(\d+)/.exec(info)?.[1])).toBeGreaterThanOrEqual(2);
    await close();
  });

  it('keeps the charting chunk off the first page a grower opens', async () => {
    const { page, close } = await openPage(browser, 390);
    const scripts: string[] = [];
    page.on('request', (request) => {
      if (request.resourceType() === 'script') scripts.push(request.url());
    });
    await signInThroughUi(page, server.baseUrl, 'grower1@millbrook.example');
    await page.waitForLoadState('networkidle');
    expect(scripts.length).toBeGreaterThan(0);
    expect(scripts.filter((url) => /vega/i.test(url))).toEqual([]);
    await page.goto(`${server.baseUrl}/sites/${ids.sites[0]!.id}/report`);
    await expectChartsDrawn(page, 2);
    expect(scripts.some((url) => /vega/i.test(url))).toBe(true);
    await close();
  });

  it('shows a published network report through the public link without signing in', async () => {
    const dataSource = server.testApp.dataSource;
    const net = await buildNetwork(dataSource, 'Browser public');
    const site = (shift: number, name: string) => ({
      fieldName: name,
      strips: rcbdStrips(
        [
          [40, 52, 55, 56],
          [42, 54, 53, 55],
          [39, 51, 56, 54],
          [41, 55, 54, 57],
        ].map((row, b) =>
          row.map((v, l) => v + shift + (((b * 3 + l * 7 + shift * 5) % 5) - 2) * 0.7),
        ),
      ),
    });
    const built = await buildReportTrial(dataSource, net, {
      name: 'Public wheat trial',
      sites: [site(0, 'East bank'), site(5, 'West bank'), site(-3, 'Mill lane')],
    });
    const coordinator = await openPage(browser, 1280);
    await signInThroughUi(coordinator.page, server.baseUrl, net.emails.coordinator);
    await coordinator.page.goto(`${server.baseUrl}/trials/${built.trialId}/report`);
    await coordinator.page.getByRole('button', { name: 'Publish network report' }).click();
    await coordinator.page.getByRole('button', { name: 'Turn the link on' }).click();
    const link = coordinator.page.locator('a[href*="/shared/"]');
    await link.waitFor();
    const href = (await link.getAttribute('href'))!;
    await screenshot(coordinator.page, 'reports-pooled-published-1280');
    await coordinator.close();

    const visitor = await openPage(browser, 390);
    await visitor.page.goto(href);
    await visitor.page.getByRole('heading', { name: 'Public wheat trial' }).waitFor();
    await expectChartsDrawn(visitor.page, 2);
    await expect(
      visitor.page.getByRole('button', { name: /Publish|Unpublish/ }).count(),
    ).resolves.toBe(0);
    await screenshot(visitor.page, 'reports-public-390');
    expect(visitor.errors).toEqual([]);
    await visitor.close();
  });
});
