// Trial design in a real browser: the demo coordinator creates a trial with the wizard, enrols two
// sites, randomizes them and opens a field packet; screenshots at 390 and 1280 px.
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ARTIFACTS,
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';

const COORDINATOR = 'coordinator@millbrook.example';
// An invented demo grower no other test signs in as.
const DEMO_GROWER = 'grower8@millbrook.example';

describe('trial design in the browser', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  const suffix = Math.random().toString(36).slice(2, 8);
  const trialName = `Browser oat trial ${suffix}`;
  const invitee = `browser-grower-${suffix}@test.example`;
  let trialPath = '';
  let packetPath = '';

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
    if (server) {
      // The test's own trial is removed so the demo network is left as it was.
      const db = server.testApp.dataSource;
      await db.query(
        'DELETE FROM sites WHERE trial_id IN (SELECT id FROM trials WHERE name = $1)',
        [trialName],
      );
      await db.query('DELETE FROM trials WHERE name = $1', [trialName]);
      await db.query('DELETE FROM invitations WHERE email = $1', [invitee]);
      await server.close();
    }
  });

  it('creates a trial with the wizard, enrols two sites, randomizes and opens a packet at 1280 px', async () => {
    const { page, errors, close } = await openPage(browser, 1280);
    await signInThroughUi(page, server.baseUrl, COORDINATOR);
    await page.goto(`${server.baseUrl}/trials/new`);

    // Step 1: crop and season.
    await page.getByLabel('Trial name').fill(trialName);
    await page
      .getByLabel('The question')
      .fill('Does half the usual oat rate yield as well on our farms?');
    await page.getByLabel('Crop').selectOption('oats');
    await page.getByLabel('Season').fill('2027');
    await page.getByRole('button', { name: 'Save and continue' }).click();
    await page.waitForURL(/\/trials\/[0-9a-f-]{36}\/edit/);
    await page.getByRole('heading', { name: /Step 2 of 5/ }).waitFor();

    // Step 2: rates (the reference rate is prefilled from the crop); check the validation message.
    await page.getByLabel('Reference (full) rate').fill('');
    await page.getByRole('button', { name: 'Save and continue' }).click();
    await page.getByText('Fill this in').first().waitFor();
    await page.getByLabel('Reference (full) rate').fill('96');
    await page.getByRole('button', { name: 'Save and continue' }).click();
    await page.getByRole('heading', { name: /Step 3 of 5/ }).waitFor();

    // Step 3: strips and blocks.
    await page.getByLabel('Rows per strip').fill('6');
    await page.getByLabel('Strip length').fill('100');
    await page.getByRole('button', { name: 'Save and continue' }).click();
    await page.getByRole('heading', { name: /Step 4 of 5/ }).waitFor();

    // Step 4: seed lot.
    await page.getByLabel('Thousand-kernel weight').fill('32');
    await page.getByLabel('Germination').fill('95');
    await page.getByRole('button', { name: 'Save and continue' }).click();
    await page.getByRole('heading', { name: /Step 5 of 5/ }).waitFor();

    // Summary: per-rate seed amounts and the planner.
    const table = page.getByRole('table').first();
    await expect(table.textContent()).resolves.toMatch(/quarter/);
    await page.getByText('How many blocks and sites?').waitFor();
    await expect(page.getByTestId('blocks-needed').textContent()).resolves.toMatch(/^\d+$/);
    await screenshot(page, 'design-wizard-summary-1280');
    await page.getByRole('button', { name: 'Send to the field' }).click();
    await page.waitForURL(/\/trials\/[0-9a-f-]{36}$/);
    trialPath = new URL(page.url()).pathname;
    await page.getByText('In the field').first().waitFor();

    // Enrol an existing member, then invite a new address.
    await page.getByRole('button', { name: 'Enrol a site' }).click();
    const grower = page.getByLabel('Grower', { exact: true });
    const option = grower.locator('option', { hasText: DEMO_GROWER });
    await grower.selectOption((await option.getAttribute('value'))!);
    await page.getByLabel('Field name').fill('Browser field A');
    await page.getByRole('button', { name: 'Enrol site' }).click();
    await page.getByText('Browser field A is enrolled.').waitFor();
    await page.getByLabel('Invite by e-mail').check();
    await page.getByLabel('Grower’s e-mail').fill(invitee);
    await page.getByLabel('Field name').fill('Browser field B');
    await page.getByRole('button', { name: 'Enrol site' }).click();
    await page.getByText(`an invitation went to ${invitee}`).waitFor();
    const mail = await server.testApp.mailCatcher.waitFor((m) => m.to.includes(invitee));
    expect(mail.subject).toContain(trialName);

    // Randomize both sites.
    const rows = page.getByTestId('site-row');
    await expect(rows.count()).resolves.toBe(2);
    for (let i = 0; i < 2; i += 1) {
      await rows.nth(i).getByRole('button', { name: 'Randomize' }).click();
      await rows.nth(i).getByText('Map ready').waitFor();
    }
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'design-trial-page-1280');

    // Open the packet of the first site.
    await rows.nth(0).getByRole('link', { name: 'Field packet' }).click();
    await page.waitForURL(/\/sites\/[0-9a-f-]{36}\/packet$/);
    packetPath = new URL(page.url()).pathname;
    await page.getByRole('heading', { name: '1. Strip map' }).waitFor();
    await expect(page.locator('svg[role="img"] g[data-rate]').count()).resolves.toBe(16);
    for (const heading of [
      '2. Seed to weigh for each strip',
      '3. Check your seeder before you sow',
      '4. What to count, and when',
      '5. Recording sheet',
      '6. Work safely',
    ]) {
      await page
        .getByRole('heading', { name: heading })
        .waitFor({ state: 'visible', timeout: 15_000 });
    }
    await page.getByText(/Zadoks 12–13/).waitFor({ state: 'visible', timeout: 15_000 });
    await screenshot(page, 'design-packet-1280');
    await page
      .locator('figure.strip-map')
      .screenshot({ path: path.join(ARTIFACTS, 'design-strip-map-1280.png') });
    await page.emulateMedia({ media: 'print' });
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true });
      expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
      fs.writeFileSync(path.join(ARTIFACTS, `design-packet-${format.toLowerCase()}.pdf`), pdf);
    }
    expect(errors).toEqual([]);
    await close();
  });

  it('shows the trial page, packet, wizard summary and calculators at 390 px', async () => {
    expect(trialPath).not.toBe('');
    const { page, errors, close } = await openPage(browser, 390);
    await signInThroughUi(page, server.baseUrl, COORDINATOR);
    await page.goto(`${server.baseUrl}${trialPath}`);
    await page.getByRole('heading', { name: /Sites \(2\)/ }).waitFor();
    await screenshot(page, 'design-trial-page-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await page.goto(`${server.baseUrl}${trialPath}/edit?step=4`);
    await page.getByRole('heading', { name: /Step 5 of 5/ }).waitFor();
    await screenshot(page, 'design-wizard-summary-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await page.goto(`${server.baseUrl}${packetPath}`);
    await page.getByRole('heading', { name: '1. Strip map' }).waitFor();
    await screenshot(page, 'design-packet-390');
    await page
      .locator('figure.strip-map')
      .screenshot({ path: path.join(ARTIFACTS, 'design-strip-map-390.png') });
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(390);

    await page.goto(`${server.baseUrl}/calculator`);
    await page.getByLabel('Amount').fill('10');
    await page.getByLabel('Unit').selectOption('seeds/ft-row');
    await expect(page.getByTestId('calc-results').textContent()).resolves.toMatch(
      /Seeds per ft²15/,
    );
    await screenshot(page, 'design-calculator-390');
    await page.goto(`${server.baseUrl}/calibrate`);
    await page.getByLabel('Wheel turns').fill('1');
    await page.getByLabel('Seeds counted').fill('80');
    await expect(page.getByTestId('percent-of-target').textContent()).resolves.toMatch(/267/);
    await screenshot(page, 'design-calibrate-390');
    expect(errors).toEqual([]);
    await close();
  });
});
