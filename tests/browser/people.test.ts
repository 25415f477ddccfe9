// The People page in a real browser: a coordinator invites someone and sees the invitation pending.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, type BuiltNetwork } from '../helpers/app';
import {
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';

describe('people page', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let net: BuiltNetwork;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    // A network of its own, so the demo network is left as it is.
    net = await buildNetwork(server.testApp.dataSource, 'People page');
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('lets a coordinator invite an address and shows it pending, on a phone and a desktop', async () => {
    const phone = await openPage(browser, 390);
    await signInThroughUi(phone.page, server.baseUrl, net.emails.coordinator);
    await phone.page.goto(`${server.baseUrl}/people`);
    await phone.page
      .getByRole('heading', { name: 'People', level: 1 })
      .waitFor({ timeout: 15_000 });
    await phone.page.getByText(net.emails.member).waitFor();

    // A coordinator may move a grower or member, not the admin.
    expect(await phone.page.getByLabel(`Role of member ${net.suffix}`).count()).toBe(1);
    expect(await phone.page.getByLabel(`Role of admin ${net.suffix}`).count()).toBe(0);

    const form = phone.page.getByRole('form', { name: 'Invite someone' });
    await form.getByLabel('E-mail').fill('not an address');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText('Enter a valid e-mail address').waitFor();

    const invitee = `invitee-${net.suffix}@test.example`;
    await form.getByLabel('E-mail').fill(invitee);
    await form.getByLabel('Role').selectOption('member');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText(`An invitation went to ${invitee}.`).waitFor();
    const pending = phone.page.getByRole('list', { name: 'Pending invitations' });
    await pending.getByText(invitee).waitFor();
    await expect(pending.textContent()).resolves.toMatch(/Member · sent/);
    // Back to the top, so the sticky header is not drawn over the middle of the full-page picture.
    await phone.page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(phone.page, 'people-coordinator-390');
    expect(phone.errors).toEqual([]);
    await phone.close();

    const desktop = await openPage(browser, 1280);
    await signInThroughUi(desktop.page, server.baseUrl, net.emails.coordinator);
    await desktop.page
      .getByRole('navigation', { name: 'Main' })
      .filter({ visible: true })
      .getByRole('link', { name: 'People' })
      .click();
    await desktop.page.waitForURL((url) => url.pathname === '/people');
    await desktop.page
      .getByRole('list', { name: 'Pending invitations' })
      .getByText(invitee)
      .waitFor({ timeout: 15_000 });
    await screenshot(desktop.page, 'people-coordinator-1280');
    expect(desktop.errors).toEqual([]);
    await desktop.close();
  }, 60_000);
});
