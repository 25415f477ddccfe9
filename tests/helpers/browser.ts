// Browser-test helpers: the real app on a loopback port serving the built web app, and
// Debian's Chromium driven by playwright-core.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { AxeBuilder } from '@axe-core/playwright';
import { chromium, type Browser, type BrowserContextOptions, type Page } from 'playwright-core';
import { inject } from 'vitest';
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

/** A full-page PNG screenshot in .test-artifacts/, to look at. */
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
    ...CONTEXT_DEFAULTS,
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

/** The browser's time zone in tests: west of UTC, where date-only values used to shift. */
export const BROWSER_TIMEZONE = process.env.BROWSER_TIMEZONE ?? 'America/Chicago';

/**
 * What every test's browser context starts from. Growers work west of UTC: pages are looked at in
 * Central time unless a test says otherwise. The offline service worker answers some requests
 * itself and would take them past `page.route`; tests that check it pass `serviceWorkers: 'allow'`.
 */
export const CONTEXT_DEFAULTS = {
  timezoneId: BROWSER_TIMEZONE,
  serviceWorkers: 'block',
} as const satisfies BrowserContextOptions;

const axeRuns = new WeakMap<Page, Promise<unknown>>();

/** Serious and critical accessibility problems axe-core finds on the page, one line each. */
export async function accessibilityProblems(page: Page): Promise<string[]> {
  // axe-core runs one check at a time in a page: queue behind a check already running.
  const previous = axeRuns.get(page) ?? Promise.resolve();
  const run = previous
    .catch(() => undefined)
    .then(() =>
      new AxeBuilder({ page })
        .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
        // Only violations are read: axe then details no passing or incomplete nodes (quicker).
        .options({ resultTypes: ['violations'] })
        .analyze(),
    );
  axeRuns.set(page, run);
  const results = await run;
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `axe ${v.id} (${v.impact}) on ${new URL(page.url()).pathname}: ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join('; ')}`,
    );
}

/** Fails when axe-core finds a serious or critical problem on the page as it is now. */
export async function expectAccessible(page: Page): Promise<void> {
  const problems = await accessibilityProblems(page);
  if (problems.length > 0) throw new Error(problems.join('\n'));
}

const AXE_SETTLE_MS = 400;

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi;

function pageKind(page: Page): string {
  const where = new URL(page.url()).pathname.replace(UUID, ':id');
  return `${page.viewportSize()?.width ?? 0}:${where}`;
}

/**
 * Claims the axe check of a kind of page (width and path with ids left out) for this run: each
 * kind is checked once per width across all test files (axe takes about a second a page, the
 * largest share of the browser tests' time). A marker file made with the `wx` flag is the claim,
 * so test files in other processes skip it; a check that did not finish gives its claim back.
 */
function claimAxeCheck(kind: string): { release(): void } | null {
  const marker = path.join(
    inject('axeChecked'),
    crypto.createHash('sha1').update(kind).digest('hex'),
  );
  try {
    fs.writeFileSync(marker, kind, { flag: 'wx' });
  } catch {
    return null;
  }
  return { release: () => fs.rmSync(marker, { force: true }) };
}

/**
 * Runs axe-core on every page a test opens (each load and each in-app navigation, once the
 * page has been still for a moment) and adds what it finds to `errors`, so every test that
 * asserts no errors also asserts no serious or critical accessibility problem.
 */
function watchAccessibility(page: Page, errors: string[]) {
  let timer: ReturnType<typeof setTimeout> | null = null;
  const seen = new Set<string>();
  const check = async () => {
    timer = null;
    if (page.isClosed()) return;
    const claim = claimAxeCheck(pageKind(page));
    if (!claim) return;
    try {
      await page.waitForLoadState('load', { timeout: 5000 });
      for (const problem of await accessibilityProblems(page)) {
        if (seen.has(problem)) continue;
        seen.add(problem);
        errors.push(problem);
      }
    } catch {
      // The page navigated or closed while axe ran: the next visit to this kind of page (here
      // or in another file) checks it instead.
      claim.release();
    }
  };
  page.on('framenavigated', (frame) => {
    if (frame !== page.mainFrame()) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => void check(), AXE_SETTLE_MS);
  });
}

/** Collects page errors and failed same-origin requests so a test can assert none happened. */
export function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  watchAccessibility(page, errors);
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
