// Renders the app icons (public/icons/*.png) from the SVG marks with Debian's Chromium.
// Run once after changing a mark: node scripts/make-icons.mjs
import fs from 'node:fs';
import { chromium } from 'playwright-core';

const jobs = [
  ['sheaf-mark.svg', 'sheaf-192.png', 192],
  ['sheaf-mark.svg', 'sheaf-512.png', 512],
  ['sheaf-maskable.svg', 'sheaf-maskable-192.png', 192],
  ['sheaf-maskable.svg', 'sheaf-maskable-512.png', 512],
  ['sheaf-maskable.svg', 'apple-touch-icon.png', 180],
];
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu'],
});
const page = await browser.newPage();
for (const [source, target, size] of jobs) {
  const svg = fs.readFileSync(`public/icons/${source}`, 'utf8');
  await page.setViewportSize({ width: size, height: size });
  await page.setContent(
    `<html><body style="margin:0;background:transparent">${svg.replace('<svg ', `<svg width="${size}" height="${size}" `)}</body></html>`,
  );
  await page.screenshot({ path: `public/icons/${target}`, omitBackground: true });
}
await browser.close();
