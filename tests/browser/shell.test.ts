// The web shell in a real browser: sign-in redirect, the coordinator's trial list and the phone menu.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  launchBrowser,
  openPage,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';

const COORDINATOR = 'coordinator@millbrook.example';

describe('web shell', () => {
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

  it('sends a signed-out visitor to sign-in and back to the page they asked for', async () => {
    const { page, errors, close } = await openPage(browser, 390);
    await page.goto(`${server.baseUrl}/admin/mail`);
    await page.waitForURL((url) => url.pathname === '/sign-in');

    expect(new URL(page.url()).searchParams.get('next')).toBe('/admin/mail');
    await page.getByLabel(/e-?mail/i).fill('admin@millbrook.example');
    await page.getByLabel(/password/i).fill('sheaf-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === '/admin/mail');
    await page
      .getByRole('heading', { name: 'Caught e-mail' })
      .waitFor({ state: 'visible', timeout: 15_000 });
    expect(errors).toEqual([]);
    await close();
  });

  for (const width of [390, 1280]) {
    it(`shows the coordinator's trials at ${width} px`, async () => {
      const { page, errors, close } = await openPage(browser, width);

      await signInThroughUi(page, server.baseUrl, COORDINATOR);
      await page.getByRole('heading', { name: 'Hulless oat seeding rate 2027' }).waitFor();

      const oat = page.getByRole('link', { name: /Hulless oat seeding rate 2027/ });
      expect(await oat.getAttribute('href')).toMatch(/^\/trials\/[0-9a-f-]{36}$/);
      const wheat = page.getByRole('link', { name: /winter wheat/i });
      await expect(wheat.first().textContent()).resolves.toMatch(/Draft/);
      await page.getByText('Demo data is invented').waitFor({ state: 'visible', timeout: 15_000 });

      await screenshot(page, `shell-coordinator-home-${width}`);
      if (width < 768) {
        await page.getByRole('button', { name: 'Menu' }).click();
      }
      const nav = page.getByRole('navigation', { name: 'Main' }).filter({ visible: true });
      await nav
        .getByRole('link', { name: 'New trial' })
        .waitFor({ state: 'visible', timeout: 15_000 });
      await nav
        .getByRole('link', { name: 'Seed calculator' })
        .waitFor({ state: 'visible', timeout: 15_000 });
      await expect(nav.getByRole('link', { name: 'Caught e-mail' }).count()).resolves.toBe(0);

      if (width < 768) await screenshot(page, `shell-coordinator-menu-${width}`);
      expect(errors).toEqual([]);
      await close();
    });
  }
});
