// Bench part "bundle": the JavaScript a first visit loads (gzip), read through Chromium.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

export async function runBundle({ base, webDist }) {
  console.log('\n== Web bundle: JavaScript a first visit loads (gzip) ==');
  const { chromium } = await import('playwright-core');
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking'],
  });
  const measure = async (label, steps) => {
    const page = await browser.newPage();
    const files = new Set();
    page.on('request', (req) => {
      if (req.url().endsWith('.js')) files.add(new URL(req.url()).pathname);
    });
    await steps(page);
    await page.waitForLoadState('networkidle');
    await page.close();
    let raw = 0;
    let gzip = 0;
    for (const file of files) {
      const buf = fs.readFileSync(path.join(webDist, file));
      raw += buf.length;
      gzip += zlib.gzipSync(buf, { level: 9 }).length;
    }
    const row = {
      page: label,
      files: files.size,
      kilobytes: Math.round(raw / 1024),
      gzipKilobytes: Math.round(gzip / 1024),
      loadsCharts: [...files].some((f) => /vega/.test(f)),
    };
    console.log(
      `${label}: ${row.files} files, ${row.kilobytes} kB, ${row.gzipKilobytes} kB gzip, chart chunk loaded: ${row.loadsCharts}`,
    );
    return row;
  };
  try {
    return [
      await measure('sign-in page', (page) => page.goto(`${base}/sign-in`)),
      await measure('sign-in then grower home', async (page) => {
        await page.goto(`${base}/sign-in`);
        await page.getByLabel(/e-?mail/i).fill('grower1@millbrook.example');
        await page.getByLabel(/password/i).fill('sheaf-demo');
        await page.getByRole('button', { name: /sign in/i }).click();
        await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
      }),
    ];
  } finally {
    await browser.close();
  }
}
