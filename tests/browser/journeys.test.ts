// End-to-end journeys through the navigation: the coordinator walks from home through the trial
// page to every page it links to and back, at phone and desktop widths; a member's home lists
// only the reports that were published, and the report pages show them no edit controls.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, demoIds } from '../helpers/app';
import {
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildReportTrial, rcbdStrips } from '../api/reports/build-report-trial';

const COORDINATOR = 'coordinator@millbrook.example';
const OAT_TRIAL = 'Hulless oat seeding rate 2027';

describe('journeys through the navigation', () => {
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

  /** Waits until the page's one main heading matches (a click navigates asynchronously). */
  async function expectMainHeading(page: Page, name: string | RegExp, because = '') {
    await page
      .getByRole('heading', { level: 1, name, exact: typeof name === 'string' })
      .waitFor({ timeout: 15_000 });
    await expect(page.getByRole('heading', { level: 1 }).count(), because).resolves.toBe(1);
  }

  async function horizontalOverflow(page: Page): Promise<number> {
    return page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  }

  async function openTrialFromHome(page: Page) {
    await page.goto(`${server.baseUrl}/`);
    await expectMainHeading(page, 'Trials');
    await page.getByRole('link', { name: new RegExp(OAT_TRIAL) }).click();
    await page.waitForURL(`**/trials/${ids.oatTrialId}`);
    await expectMainHeading(page, new RegExp(OAT_TRIAL));
  }

  for (const width of [390, 1280]) {
    it(`walks the coordinator from home through the trial page to every linked page at ${width} px`, async () => {
      const { page, errors, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await openTrialFromHome(page);
      await screenshot(page, `journeys-trial-${width}`);

      const barn = () => page.getByTestId('site-row').filter({ hasText: 'Barn field' });
      const aside = () => page.getByRole('complementary');
      // Each stop: the link to click on the trial page, the heading it must show, and the way back.
      const stops: {
        name: string;
        click: () => Promise<void>;
        path: RegExp;
        heading: RegExp;
        back: string;
      }[] = [
        {
          name: 'progress',
          path: /\/trials\/[^/]+\/progress$/,
          click: () => aside().getByRole('link', { name: 'Data progress' }).click(),
          heading: /Numbers coming in/,
          back: OAT_TRIAL,
        },
        {
          name: 'site-data',
          path: /\/sites\/[^/]+$/,
          click: () => barn().getByRole('link', { name: 'Data entry' }).click(),
          heading: /^Barn field$/,
          back: OAT_TRIAL,
        },
        {
          name: 'map',
          path: /\/map$/,
          click: () => barn().getByRole('link', { name: 'Strip map' }).click(),
          heading: /Strip map: Barn field/,
          back: OAT_TRIAL,
        },
        {
          name: 'packet',
          path: /\/packet$/,
          click: () => barn().getByRole('link', { name: 'Field packet' }).click(),
          heading: /Barn field — /,
          back: OAT_TRIAL,
        },
        {
          name: 'site-report',
          path: /\/sites\/[^/]+\/report$/,
          click: () => barn().getByRole('link', { name: 'Site report' }).click(),
          heading: /^Barn field$/,
          back: OAT_TRIAL,
        },
        {
          name: 'pooled-report',
          path: /\/trials\/[^/]+\/report$/,
          click: () => aside().getByRole('link', { name: 'Pooled report' }).click(),
          heading: new RegExp(OAT_TRIAL),
          back: OAT_TRIAL,
        },
        {
          name: 'meeting',
          path: /\/meeting$/,
          click: () => aside().getByRole('link', { name: 'Meeting view' }).click(),
          heading: new RegExp(OAT_TRIAL),
          back: 'Back to the report',
        },
      ];
      for (const stop of stops) {
        await stop.click();
        await page.waitForURL((url) => stop.path.test(url.pathname));
        await expectMainHeading(page, stop.heading, stop.name);
        expect(await horizontalOverflow(page), stop.name).toBeLessThanOrEqual(1);
        await screenshot(page, `journeys-${stop.name}-${width}`);
        // No dead ends: every page leads back up (the meeting view back to its report).
        const up = page.getByRole('link', { name: stop.back }).first();
        await up.waitFor({ state: 'visible', timeout: 15_000 });
        await up.click();
        if (stop.name === 'meeting') {
          await page.waitForURL(`**/trials/${ids.oatTrialId}/report`);
          await page.getByRole('link', { name: OAT_TRIAL }).first().click();
        }
        await page.waitForURL(`**/trials/${ids.oatTrialId}`);
        await expectMainHeading(page, new RegExp(OAT_TRIAL), `back from ${stop.name}`);
      }

      // The strip CSV export linked from the pooled report downloads as CSV.
      await aside().getByRole('link', { name: 'Pooled report' }).click();
      await expectMainHeading(page, new RegExp(OAT_TRIAL));
      const csvHref = await page.getByRole('link', { name: 'Strips CSV' }).getAttribute('href');
      const csv = await page.request.get(`${server.baseUrl}${csvHref}`);
      expect(csv.status()).toBe(200);
      expect(csv.headers()['content-type']).toMatch(/text\/csv/);

      // An unknown address inside the app still has a heading and a way home.
      await page.goto(`${server.baseUrl}/trials/${ids.oatTrialId}/nowhere`);
      await expectMainHeading(page, 'No such page');
      await page.getByRole('link', { name: 'Back to home' }).click();
      await expectMainHeading(page, 'Trials');

      expect(errors).toEqual([]);
      await close();
      // Many pages, each also checked by axe-core: more than the default minute on 2 shared cores.
    }, 180_000);
  }

  it('shows a member only the published reports, without edit controls', async () => {
    const dataSource = server.testApp.dataSource;
    const net = await buildNetwork(dataSource, 'Browser journeys');
    const site = (shift: number, name: string, growerUserId: string | null) => ({
      fieldName: name,
      growerUserId,
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
    const published = await buildReportTrial(dataSource, net, {
      name: 'Journey barley trial',
      sites: [
        site(0, 'East bank', net.userIds.grower),
        site(5, 'West bank', net.userIds.grower2),
        site(-3, 'Mill lane', null),
      ],
    });
    await buildReportTrial(dataSource, net, {
      name: 'Journey unpublished trial',
      sites: [site(2, 'Quiet corner', null)],
    });

    // The coordinator publishes the pooled report and one site's report through the pages.
    const coordinator = await openPage(browser, 1280);
    await signInThroughUi(coordinator.page, server.baseUrl, net.emails.coordinator);
    await coordinator.page.goto(`${server.baseUrl}/trials/${published.trialId}/report`);
    await coordinator.page.getByRole('button', { name: 'Publish network report' }).click();
    await coordinator.page.getByText(/^Published /).waitFor();
    await coordinator.page.goto(`${server.baseUrl}/sites/${published.siteIds[0]}/report`);
    await coordinator.page.getByRole('button', { name: 'Publish site report' }).click();
    await coordinator.page.getByText(/^Published /).waitFor();
    expect(coordinator.errors).toEqual([]);
    await coordinator.close();

    for (const width of [390, 1280]) {
      const { page, errors, close } = await openPage(browser, width);
      await signInThroughUi(page, server.baseUrl, net.emails.member);
      await expectMainHeading(page, 'Reports');
      const reports = page.getByTestId('trial-reports');
      await expect(reports.count()).resolves.toBe(1);
      await reports
        .getByRole('heading', { name: 'Journey barley trial' })
        .waitFor({ state: 'visible', timeout: 15_000 });
      await expect(reports.getByRole('link').allTextContents()).resolves.toEqual([
        expect.stringContaining('Network report'),
        // The grower has not chosen to be named, so members see a neutral farm label.
        expect.stringContaining('Site report: Farm A'),
      ]);
      await expect(page.getByText('East bank').count()).resolves.toBe(0);
      await expect(page.getByText('Journey unpublished trial').count()).resolves.toBe(0);
      await expect(page.getByText('West bank').count()).resolves.toBe(0);
      await expect(page.getByRole('link', { name: 'New trial' }).count()).resolves.toBe(0);
      expect(await horizontalOverflow(page)).toBeLessThanOrEqual(1);
      await screenshot(page, `journeys-member-home-${width}`);

      await reports.getByRole('link', { name: /Network report/ }).click();
      await expectMainHeading(page, 'Journey barley trial');
      await expect(
        page.getByRole('button', { name: /Publish|Unpublish|Turn the link/ }).count(),
      ).resolves.toBe(0);
      await expect(page.getByRole('link', { name: 'Strips CSV' }).count()).resolves.toBe(0);
      await screenshot(page, `journeys-member-pooled-${width}`);
      await page.getByRole('link', { name: 'Reports' }).first().click();
      await expectMainHeading(page, 'Reports');

      await page.getByRole('link', { name: /Site report: Farm A/ }).click();
      await expectMainHeading(page, 'Farm A');
      await expect(page.getByRole('button', { name: /Publish|Unpublish/ }).count()).resolves.toBe(
        0,
      );
      await screenshot(page, `journeys-member-site-${width}`);

      // A report that is not published says so, with a heading and a way home.
      await page.goto(`${server.baseUrl}/sites/${published.siteIds[1]}/report`);
      await expectMainHeading(page, 'This site report is not published yet');
      await page.getByRole('link', { name: 'Back to home' }).click();
      await expectMainHeading(page, 'Reports');

      expect(errors).toEqual([]);
      await close();
    }
  }, 180_000);
});
