// Two networks side by side in a real browser: sign up with the e-mailed link, switch networks
// in the header, close a trial's loop, and a grower's privacy choice and recording sheet.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildNetwork, type BuiltNetwork } from '../helpers/app';
import {
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildReportTrial, rcbdStrips } from '../api/reports/build-report-trial';

describe('networks in the browser', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let north: BuiltNetwork;
  let south: BuiltNetwork;
  let northTrial: string;
  let northSite: string;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    const db = server.testApp.dataSource;
    north = await buildNetwork(db, 'North Circle');
    south = await buildNetwork(db, 'South Circle');
    // North's coordinator also coordinates the south network.
    await db.query(
      `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'coordinator')`,
      [north.userIds.coordinator, south.networkId],
    );
    const yields = [
      [40, 52, 58, 60],
      [42, 50, 57, 61],
    ];
    const built = await buildReportTrial(db, north, {
      name: 'North oats',
      sites: [
        {
          fieldName: 'Creek field',
          growerUserId: north.userIds.grower,
          strips: rcbdStrips(yields),
        },
      ],
    });
    northTrial = built.trialId;
    northSite = built.siteIds[0]!;
    await buildReportTrial(db, south, {
      name: 'South wheat',
      sites: [
        { fieldName: 'Hill field', growerUserId: south.userIds.grower, strips: rcbdStrips(yields) },
      ],
    });
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('signs up on a phone, confirms by the e-mailed link and lands in the new network', async () => {
    const phone = await openPage(browser, 390);
    await phone.page.goto(`${server.baseUrl}/sign-up`);
    const form = phone.page.getByTestId('sign-up-form');
    await form.getByLabel('Your name').fill('Ina Bell');
    const email = `ina-${north.suffix}@test.example`;
    await form.getByLabel('E-mail address').fill(email);
    await form.getByLabel(/Password/).fill('long enough password');
    await form.getByLabel('Name of your network').fill(`Ridge Circle ${north.suffix}`);
    await screenshot(phone.page, 'sign-up-390');
    await form.getByRole('button', { name: /confirmation link/ }).click();
    await phone.page.getByText('Check your inbox').waitFor();
    const mail = await server.testApp.mailCatcher.waitFor((m) => m.to.includes(email));
    const link = /https?:\/\/[^\s]+\/sign-up\/confirm\/[A-Za-z0-9_-]+/.exec(mail.text)![0];
    await phone.page.goto(`${server.baseUrl}${new URL(link).pathname}`);
    await phone.page
      .getByRole('heading', { name: 'Trials', level: 1 })
      .waitFor({ timeout: 15_000 });
    await phone.page.getByText('No trials yet').waitFor();
    const switcher = phone.page.getByTestId('network-switcher');
    await expect(switcher.inputValue()).resolves.toMatch(/[0-9a-f-]{36}/);
    await expect(switcher.locator('option:checked').textContent()).resolves.toBe(
      `Ridge Circle ${north.suffix}`,
    );
    await screenshot(phone.page, 'signed-up-home-390');
    expect(phone.errors).toEqual([]);
    await phone.close();
  });

  it('switches between two networks in the header and shows only that network’s trials', async () => {
    const desk = await openPage(browser, 1280);
    await signInThroughUi(desk.page, server.baseUrl, north.emails.coordinator);
    const switcher = desk.page.getByTestId('network-switcher');
    await switcher.selectOption(north.networkId);
    await desk.page.getByText('North oats').waitFor();
    expect(await desk.page.getByText('South wheat').count()).toBe(0);
    await screenshot(desk.page, 'network-north-1280');
    await switcher.selectOption(south.networkId);
    await desk.page.getByText('South wheat').waitFor();
    expect(await desk.page.getByText('North oats').count()).toBe(0);
    await screenshot(desk.page, 'network-south-1280');

    // The trial page: its life panel shows harvest in; closing moves it apart on the home page.
    await switcher.selectOption(north.networkId);
    await desk.page.goto(`${server.baseUrl}/trials/${northTrial}`);
    const life = desk.page.getByTestId('trial-life');
    await life.getByText('1 of 1 sites have a yield').waitFor({ timeout: 15_000 });
    await screenshot(desk.page, 'trial-life-1280');
    await life.getByRole('button', { name: 'Close the trial' }).click();
    await life.getByRole('button', { name: 'Reopen' }).waitFor();
    await desk.page.goto(`${server.baseUrl}/`);
    await desk.page.getByTestId('closed-trials').getByText('North oats').waitFor();
    expect(desk.errors).toEqual([]);
    await desk.close();
  });

  it('lets a grower choose a neutral label and prints units on every sheet column', async () => {
    const phone = await openPage(browser, 390);
    await signInThroughUi(phone.page, server.baseUrl, north.emails.grower);
    await phone.page.goto(`${server.baseUrl}/sites/${northSite}`);
    const choice = phone.page.getByTestId('naming-choice');
    const namedInDb = async () =>
      (
        await server.testApp.dataSource.query('SELECT named_in_reports FROM sites WHERE id = $1', [
          northSite,
        ])
      )[0].named_in_reports as boolean;
    await choice.getByLabel(/By name/).click();
    await vi.waitFor(async () => expect(await namedInDb()).toBe(true));
    await choice.getByLabel(/Farm A/).click();
    await vi.waitFor(async () => expect(await namedInDb()).toBe(false));
    await expect(choice.getByLabel(/Farm A/).isChecked()).resolves.toBe(true);
    await phone.page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(phone.page, 'grower-site-naming-390');

    await phone.page.goto(`${server.baseUrl}/sites/${northSite}/packet`);
    const sheet = phone.page.getByTestId('recording-sheet');
    await sheet.waitFor({ timeout: 15_000 });
    const headers = await sheet.locator('thead tr').first().locator('th').allTextContents();
    // Every column but the plot and rate names says its unit.
    for (const header of headers.slice(2)) expect(header).toMatch(/\(.+\)/);
    expect(headers.join(' | ')).toMatch(/Rows harvested \(rows\).*Length harvested \(ft\)/);
    expect(headers.join(' | ')).toMatch(/Threshed grain weight \(lb\)/);
    await sheet.scrollIntoViewIfNeeded();
    await screenshot(phone.page, 'packet-sheet-390');
    expect(phone.errors).toEqual([]);
    await phone.close();
  });
});
