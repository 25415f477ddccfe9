// The series report in a real browser: the demo's two oat seasons beside their pool at phone
// and desktop widths, and a coordinator starting a series and adding a trial through the forms.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork } from '../helpers/app';
import {
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildReportTrial } from '../api/reports/build-report-trial';

describe('series across seasons in the browser', () => {
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

  it('shows the demo series with each season beside the pool at 1280 and 390 px', async () => {
    const { page, errors, close } = await openPage(browser, 1280);
    try {
      await signInThroughUi(page, server.baseUrl, 'coordinator@millbrook.example');
      await page.goto(`${server.baseUrl}/series`);
      await page.getByRole('link', { name: /Hulless oat seeding rate, 2026 onwards/ }).click();
      await page.getByRole('heading', { name: 'Each season beside the pool' }).waitFor();
      const table = page.getByRole('region', { name: /Expected yield at a farm like these/ });
      await expect(table.getByRole('columnheader', { name: '2026 alone' }).count()).resolves.toBe(
        1,
      );
      await expect(table.getByRole('columnheader', { name: '2027 alone' }).count()).resolves.toBe(
        1,
      );
      await expect(
        page.getByText(/did as well as the full rate in \d of 2 seasons/).count(),
      ).resolves.toBeGreaterThan(0);
      await page.getByRole('heading', { name: 'For the statistician' }).waitFor();
      await screenshot(page, 'series-report-1280');
      await page.setViewportSize({ width: 390, height: 844 });
      await screenshot(page, 'series-report-390');
      // Nothing wider than the phone except the scrolling tables.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(overflow).toBeLessThanOrEqual(390);
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });

  it('lets a coordinator start a series and add a trial of its crop', async () => {
    const net = await buildNetwork(server.testApp.dataSource, 'Browser series');
    const trial = await buildReportTrial(server.testApp.dataSource, net, {
      name: 'Browser rye 2027',
      crop: 'rye',
      sites: [],
    });
    const { page, errors, close } = await openPage(browser, 1280);
    try {
      await signInThroughUi(page, server.baseUrl, net.emails.coordinator);
      await page.goto(`${server.baseUrl}/series`);
      await page.getByLabel('Series name').fill('Rye over the years');
      await page.getByLabel('Crop').selectOption('rye');
      await page.getByRole('button', { name: 'Start the series' }).click();
      await page.getByRole('link', { name: 'Rye over the years' }).click();
      await page.getByLabel('Add a trial', { exact: true }).selectOption(trial.trialId);
      await page.getByRole('button', { name: 'Add to series' }).click();
      await page.getByRole('link', { name: 'Browser rye 2027' }).waitFor();
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  });
});
