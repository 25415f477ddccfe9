// Browser-test helpers: the real app on a loopback port serving the built web app, and
// Debian's Chromium driven by playwright-core.
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContextOptions, type Page } from 'playwright-core';
import { createTestApp, type TestApp } from './app';

export const ARTIFACTS = path.resolve('.test-artifacts');

/** The shared two-worker server serving the built web app, or one of this test's own with `env`. */
export async function startTestServer(
  env: Record<string, string> = {},
): Promise<{ baseUrl: string; testApp: TestApp; close(): Promise<void> }> {
  const webDist = process.env.WEB_DIST ?? 'dist/web';
  if (!fs.existsSync(`${webDist}/index.html`))
    throw new Error(`${webDist} is missing: npm test builds it first`);
  const testApp = await createTestApp(env);
  return { baseUrl: testApp.app, testApp, close: () => testApp.close() };
}

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  const file = path.join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** A page in a fresh context at `width` px (844 px high below 500 px wide, else 900), with its errors collected. */
export async function openPage(
  browser: Browser,
  width: number,
  options: BrowserContextOptions = {},
) {
  const context = await browser.newContext({
    viewport: { width, height: width < 500 ? 844 : 900 },
    ...options,
  });
  const page = await context.newPage();
  return { page, context, errors: watchErrors(page), close: () => context.close() };
}

/** Signs in through the sign-in page and waits for the home page. */
export async function signInThroughUi(
  page: Page,
  baseUrl: string,
  email: string,
  password = 'sheaf-demo',
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Collects page errors and failed same-origin requests so a test can assert none happened. */
export function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(`pageerror: ${error.message}`));
  page.on('console', (message) => {
    if (
      message.type() === 'error' &&
      !/Failed to load resource: the server responded with a status of 4\d\d/.test(message.text())
    ) {
      errors.push(`console: ${message.text()}`);
    }
  });
  return errors;
}
