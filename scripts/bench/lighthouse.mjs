// Bench part "lighthouse": the Lighthouse npm package in Debian's Chromium, mobile emulation with
// its default simulated slow 4G and 4× CPU slowdown, on the sign-in page and a grower's site page.
import fs from 'node:fs';
import path from 'node:path';
import { DATA_DIR } from '../lib/env.mjs';
import { freePort } from '../lib/postgres.mjs';
import { signIn } from './environment.mjs';

export async function runLighthouse({ base }) {
  console.log('\n== Lighthouse (mobile, simulated slow 4G, 4× CPU slowdown) ==');
  const { default: lighthouse } = await import('lighthouse');
  const { chromium } = await import('playwright-core');
  const debugPort = await freePort();
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      `--remote-debugging-port=${debugPort}`,
    ],
  });
  const growerCookie = (await signIn(base, 'grower1@millbrook.example')).cookie;
  const mine = await (
    await fetch(`${base}/api/sites/mine`, { headers: { cookie: growerCookie } })
  ).json();
  const siteId = (Array.isArray(mine) ? mine : mine.items)[0].id;
  const audit = async (label, url, cookieHeader) => {
    const runnerResult = await lighthouse(url, {
      port: debugPort,
      output: 'json',
      logLevel: 'error',
      onlyCategories: ['performance', 'accessibility'],
      ...(cookieHeader ? { extraHeaders: { Cookie: cookieHeader } } : {}),
    });
    const lhr = runnerResult.lhr;
    // The full report, to see what the score is made of (open it in any JSON viewer).
    fs.mkdirSync(DATA_DIR, { recursive: true });
    fs.writeFileSync(
      path.join(DATA_DIR, `lighthouse-${label.replace(/\W+/g, '-')}.json`),
      JSON.stringify(lhr),
    );
    const row = {
      page: label,
      performance: Math.round((lhr.categories.performance.score ?? 0) * 100),
      accessibility: Math.round((lhr.categories.accessibility.score ?? 0) * 100),
      largestContentfulPaintSeconds:
        Math.round(lhr.audits['largest-contentful-paint'].numericValue / 100) / 10,
      transferredKilobytes: Math.round(lhr.audits['total-byte-weight'].numericValue / 1024),
    };
    console.log(
      `${label}: performance ${row.performance}, accessibility ${row.accessibility}, LCP ${row.largestContentfulPaintSeconds} s, ${row.transferredKilobytes} KiB transferred`,
    );
    return row;
  };
  try {
    return [
      await audit('sign-in page', `${base}/sign-in`),
      await audit('grower site page', `${base}/sites/${siteId}`, growerCookie),
    ];
  } finally {
    await browser.close();
  }
}
