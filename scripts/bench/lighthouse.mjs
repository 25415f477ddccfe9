// Bench part "lighthouse": the Lighthouse npm package in Debian's Chromium, mobile emulation with
// its default simulated slow 4G and 4× CPU slowdown, on the sign-in page and a grower's site page.
// Each page is measured BENCH_LIGHTHOUSE_RUNS times (default 3), alternating pages, and the median
// of each figure is reported: Lighthouse scales the CPU time it observes, so one run on a busy
// machine says little.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { DATA_DIR } from '../lib/env.mjs';
import { freePort } from '../lib/postgres.mjs';
import { signIn } from './environment.mjs';

const RUNS = Math.max(1, Number(process.env.BENCH_LIGHTHOUSE_RUNS ?? 3) || 3);
/** The pause before each run, in milliseconds (see the loop below). */
const SETTLE_MS = 3000;

const median = (values) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
};
const seconds = (ms) => Math.round(ms / 100) / 10;

/** The figures of one Lighthouse report. */
function figures(lhr) {
  const audit = (id) => lhr.audits[id].numericValue;
  return {
    performance: Math.round((lhr.categories.performance.score ?? 0) * 100),
    accessibility: Math.round((lhr.categories.accessibility.score ?? 0) * 100),
    firstContentfulPaintSeconds: seconds(audit('first-contentful-paint')),
    largestContentfulPaintSeconds: seconds(audit('largest-contentful-paint')),
    totalBlockingTimeMs: Math.round(audit('total-blocking-time')),
    cumulativeLayoutShift: Math.round(audit('cumulative-layout-shift') * 1000) / 1000,
    transferredKilobytes: Math.round(audit('total-byte-weight') / 1024),
  };
}

const describe = (row) =>
  `performance ${row.performance}, accessibility ${row.accessibility}, FCP ${row.firstContentfulPaintSeconds} s, LCP ${row.largestContentfulPaintSeconds} s, TBT ${row.totalBlockingTimeMs} ms, CLS ${row.cumulativeLayoutShift}, ${row.transferredKilobytes} KiB transferred`;

/**
 * Opens the site page once in the browser's default profile (the one Lighthouse's tabs share) and
 * waits until its service worker has installed the app, as a grower's first visit leaves it.
 */
async function installApp(browser, url, cookie) {
  const cdp = await browser.newBrowserCDPSession();
  await cdp.send('Storage.setCookies', {
    cookies: cookie.split('; ').map((pair) => {
      const at = pair.indexOf('=');
      return { name: pair.slice(0, at), value: pair.slice(at + 1), url };
    }),
  });
  const { targetId } = await cdp.send('Target.createTarget', { url });
  const { sessionId } = await cdp.send('Target.attachToTarget', { targetId, flatten: true });
  const evaluate = async (expression) =>
    (
      await cdp.send(
        'Runtime.evaluate',
        { expression, awaitPromise: true, returnByValue: true },
        sessionId,
      )
    ).result.value;
  for (let waited = 0; waited < 30_000; waited += 500) {
    await new Promise((resolve) => setTimeout(resolve, 500));
    const ready = await evaluate(
      `navigator.serviceWorker?.getRegistration().then((r) => r?.active?.state === 'activated') ?? false`,
    ).catch(() => false);
    if (ready) break;
  }
  await cdp.send('Target.closeTarget', { targetId });
  await cdp.detach();
}

export async function runLighthouse({ base }) {
  console.log(
    `\n== Lighthouse (mobile, simulated slow 4G, 4× CPU slowdown), median of ${RUNS} run(s) per page ==`,
  );
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
  const siteUrl = `${base}/sites/${siteId}`;
  const pages = [
    { label: 'sign-in page', url: `${base}/sign-in` },
    { label: 'grower site page', url: siteUrl, cookie: growerCookie },
    // The same page opened again, as a grower does in the field: the service worker installed on
    // the first visit serves the app's code from the phone, so only the data comes over the air.
    { label: 'grower site page, opened again', url: siteUrl, cookie: growerCookie, warm: true },
  ];
  if (pages.some((page) => page.warm)) await installApp(browser, siteUrl, growerCookie);
  const runs = new Map(pages.map((page) => [page.label, []]));
  try {
    for (let run = 1; run <= RUNS; run++) {
      for (const page of pages) {
        // A pause first, so the run before (Chromium closing its tab, the service worker
        // installing, Lighthouse's own clean-up) does not share the two cores with this one.
        await new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
        const load = os.loadavg()[0];
        const { lhr } = await lighthouse(page.url, {
          port: debugPort,
          output: 'json',
          logLevel: 'error',
          onlyCategories: ['performance', 'accessibility'],
          // A first visit starts from empty storage; an "opened again" run keeps the installed app.
          disableStorageReset: page.warm === true,
          ...(page.cookie ? { extraHeaders: { Cookie: page.cookie } } : {}),
        });
        if (lhr.categories.performance.score === null) {
          // Lighthouse could not read the trace (it happens on a very busy machine): say so, and
          // leave the run out of the medians.
          console.log(
            `  run ${run}, ${page.label}: no score (${lhr.runtimeError?.code ?? 'metrics missing'}), left out`,
          );
          continue;
        }
        const row = figures(lhr);
        runs.get(page.label).push({ row, lhr });
        console.log(
          `  run ${run}, ${page.label}: ${describe(row)} (load average ${load.toFixed(1)})`,
        );
      }
    }
  } finally {
    await browser.close();
  }
  fs.mkdirSync(DATA_DIR, { recursive: true });
  return pages.map(({ label }) => {
    const measured = runs.get(label);
    if (measured.length === 0) {
      console.log(`${label}: no run gave a score`);
      return { page: label, runs: 0 };
    }
    const row = { page: label, runs: measured.length };
    for (const key of Object.keys(measured[0].row))
      row[key] = median(measured.map((m) => m.row[key]));
    // The full report of the run whose score is the median (open it in any JSON viewer).
    const middle = [...measured].sort((a, b) => a.row.performance - b.row.performance)[
      Math.floor(measured.length / 2)
    ];
    fs.writeFileSync(
      path.join(DATA_DIR, `lighthouse-${label.replace(/\W+/g, '-')}.json`),
      JSON.stringify(middle.lhr),
    );
    console.log(`${label}, median of ${row.runs}: ${describe(row)}`);
    return row;
  });
}
