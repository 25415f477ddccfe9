// PDF export: a print document built on the server (findings, tables and the charts rendered
// to SVG by Vega in Node), printed by one shared Chromium through playwright-core with a small
// bounded queue, and stored in PostgreSQL so an unchanged report is not printed again.
import crypto from 'node:crypto';
import fs from 'node:fs';
import { chromium, type Browser } from 'playwright-core';
import { LessThan, type DataSource } from 'typeorm';
import { parse, View } from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';
import {
  componentsSpec,
  forestSpec,
  rateMeansSpec,
  responseCurveSpec,
  stripMapSpec,
  type ChartSpec,
} from '../../shared/reports/chart-specs';
import {
  decimalsFor,
  formatMoney,
  formatNumber,
  formatP,
} from '../../shared/reports/format-numbers';
import { rateName } from '../../shared/reports/findings';
import type { PooledReport, SiteReport } from '../../shared/schemas/report';
import { pricesInWords, reportDisplayUnits } from '../../shared/units/report-units';
import { ReportPdf } from '../../db/entities/report-pdf.entity';
import { Busy } from '../errors';
import { escapeHtml as esc } from '../mail/mailer';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const PRINT_WIDTH = 640;

/** Replaces "container" widths (browser only) with a fixed print width. */
function fixedWidth(spec: ChartSpec, width: number): ChartSpec {
  const copy: ChartSpec = { ...spec };
  if (copy.width === 'container') copy.width = width;
  if (copy.autosize) copy.autosize = { type: 'fit', contains: 'padding' };
  return copy;
}

/** Renders a Vega-Lite spec to an SVG string in Node (no browser, no eval concerns here). */
export async function chartSvg(spec: ChartSpec, width = PRINT_WIDTH): Promise<string> {
  const compiled = compile(fixedWidth(spec, width) as unknown as TopLevelSpec).spec;
  const view = new View(parse(compiled), { renderer: 'none' });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}

async function safeChart(spec: ChartSpec, caption: string): Promise<string> {
  try {
    return `<figure>${await chartSvg(spec)}<figcaption>${esc(caption)}</figcaption></figure>`;
  } catch (error) {
    return `<p class="muted">Chart not available: ${esc((error as Error).message)}</p>`;
  }
}

const STYLE = `
  @page { size: Letter; margin: 16mm 14mm; }
  body { font-family: 'Inter Variable', Inter, 'DejaVu Sans', Arial, sans-serif; color: #26201b; font-size: 10.5pt; line-height: 1.45; }
  h1 { font-size: 19pt; margin: 0 0 2pt; color: #1d4f2e; }
  h2 { font-size: 13pt; margin: 16pt 0 6pt; border-bottom: 1.5pt solid #e4c06a; padding-bottom: 2pt; break-after: avoid; }
  .eyebrow { text-transform: uppercase; letter-spacing: .08em; font-size: 8.5pt; color: #7b561f; font-weight: 700; }
  .muted { color: #6a5a49; }
  dl { display: grid; grid-template-columns: max-content 1fr max-content 1fr; gap: 2pt 10pt; margin: 8pt 0; }
  dt { font-weight: 600; color: #6a5a49; } dd { margin: 0; }
  ul.findings li { margin-bottom: 4pt; }
  table { border-collapse: collapse; width: 100%; margin: 4pt 0 8pt; font-size: 9.5pt; break-inside: avoid; }
  th, td { border-bottom: 0.75pt solid #e2dacf; padding: 3pt 5pt; text-align: right; font-variant-numeric: tabular-nums; }
  th:first-child, td:first-child { text-align: left; }
  th { background: #f1ede7; font-weight: 650; }
  figure { margin: 6pt 0 10pt; break-inside: avoid; } figcaption { font-size: 8.5pt; color: #6a5a49; }
  svg { max-width: 100%; height: auto; }
  .note { border-left: 3pt solid #bf8c2c; padding: 4pt 8pt; background: #fbf6e9; margin: 6pt 0; }
  footer { margin-top: 14pt; font-size: 8pt; color: #6a5a49; }
`;

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><style>${STYLE}</style></head><body>${body}<footer>Printed from Sheaf on ${new Date().toISOString().slice(0, 10)}. Seeding rates in a trial are treatments to compare, not recommendations; follow local extension advice and the seed label.</footer></body></html>`;
}

function table(head: string[], rows: (string | number)[][]): string {
  return `<table><thead><tr>${head.map((h) => `<th>${esc(h)}</th>`).join('')}</tr></thead><tbody>${rows
    .map((r) => `<tr>${r.map((c) => `<td>${esc(String(c))}</td>`).join('')}</tr>`)
    .join('')}</tbody></table>`;
}

function anovaTable(
  rows: { source: string; df: number; ss: number; ms?: number; f?: number; p?: number }[],
  digits: number,
): string {
  return table(
    ['Source', 'df', 'Sum of squares', 'Mean square', 'F', 'p'],
    rows.map((r) => [
      r.source,
      r.df,
      formatNumber(r.ss, digits),
      r.ms === undefined ? '' : formatNumber(r.ms, digits),
      r.f === undefined ? '' : formatNumber(r.f, 2),
      r.p === undefined ? '' : formatP(r.p).replace('p = ', '').replace('p < ', '< '),
    ]),
  );
}

export async function siteReportHtml(report: SiteReport): Promise<string> {
  const { site, analysis } = report;
  const unit = site.units.yield;
  const { perArea } = reportDisplayUnits(site.units, site.crop);
  const area = (value: number | null) => (value === null ? null : perArea.fromStored(value));
  const areaDigits = perArea.unit === 'm²' ? 0 : 1;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const label = (rate: string) => site.design.rates.find((r) => r.key === rate)?.label ?? rate;
  const parts: string[] = [];
  parts.push(
    `<p class="eyebrow">Site report · ${esc(site.trialName)}</p><h1>${esc(site.fieldName)}</h1>`,
  );
  if (report.published)
    parts.push(
      `<p class="muted">Published ${esc(report.published.publishedAt.slice(0, 10))}${report.dataChangedSincePublished ? ' — data changed since publishing' : ''}</p>`,
    );
  parts.push(`<dl>
    <dt>Grower</dt><dd>${esc(site.growerName ?? '—')}</dd><dt>Crop, season</dt><dd>${esc(site.cropName ?? '—')}, ${esc(site.season ?? '—')}</dd>
    <dt>Sown</dt><dd>${esc(site.dates.sowing ?? '—')}</dd><dt>Harvested</dt><dd>${esc(site.dates.harvest ?? '—')}</dd>
    <dt>Design</dt><dd>${site.design.rates.length} rates × ${site.design.blocks} blocks (RCBD)</dd>
    <dt>Data</dt><dd>${site.completeness.withYield} of ${site.completeness.strips} strips with yield</dd>
    <dt>Soil</dt><dd>${esc(site.soil || '—')}</dd><dt>Previous crop</dt><dd>${esc(site.previousCrop || '—')}</dd></dl>`);
  parts.push(
    `<h2>What this site found</h2><ul class="findings">${report.findings.map((f) => `<li>${esc(f)}</li>`).join('')}</ul>`,
  );
  if (analysis) {
    parts.push('<h2>Charts</h2>');
    parts.push(
      await safeChart(
        rateMeansSpec({
          means: analysis.means.map((m) => ({
            label: label(m.rate),
            mean: m.mean,
            ciLow: m.ciLow,
            ciHigh: m.ciHigh,
          })),
          strips: report.strips.map((s) => ({ label: s.label, yield: s.yield, block: s.block })),
          yieldUnit: unit,
        }),
        'Rate means with 95 % confidence intervals (filled) and the individual strips (open).',
      ),
    );
    parts.push(
      await safeChart(
        stripMapSpec({ strips: report.strips, yieldUnit: unit }),
        'Strip map coloured by yield.',
      ),
    );
    parts.push(
      await safeChart(
        componentsSpec({ rows: report.components.byRate, perArea }),
        'Yield components by rate (means over strips).',
      ),
    );
    parts.push('<h2>Analysis of variance</h2>');
    parts.push(anovaTable(analysis.anova as never, digits));
    parts.push(
      `<p>Grand mean ${formatNumber(analysis.grandMean, digits)} ${esc(unit)}; CV ${formatNumber(analysis.cvPercent, 1)} %; LSD (5 %) ${formatNumber(analysis.lsd, digits)}; Tukey HSD ${formatNumber(analysis.hsd, digits)}.</p>`,
    );
    parts.push('<h2>Rate means</h2>');
    parts.push(
      table(
        ['Rate', 'Strips', `Mean (${unit})`, '95 % CI', 'Group'],
        analysis.means.map((m) => [
          label(m.rate),
          m.n,
          formatNumber(m.mean, digits),
          `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
          m.group,
        ]),
      ),
    );
    parts.push(`<h2>Difference from the ${esc(rateName(label(analysis.reference)))}</h2>`);
    parts.push(
      table(
        ['Rate', `Difference (${unit})`, '95 % CI', 'p'],
        analysis.differences.map((d) => [
          label(d.rate),
          formatNumber(d.diff, digits),
          `${formatNumber(d.ciLow, digits)} – ${formatNumber(d.ciHigh, digits)}`,
          formatP(d.p),
        ]),
      ),
    );
  } else if (report.analysisError) {
    parts.push(`<p class="note">${esc(report.analysisError)}</p>`);
  }
  parts.push('<h2>Yield components and seed economics</h2>');
  parts.push(
    table(
      [
        'Rate',
        `Seed (${site.units.seed})`,
        `Plants/${perArea.unit}`,
        'Tillers/plant',
        `Heads/${perArea.unit}`,
        `Yield (${unit})`,
        'Seed return',
        `Return over seed (${site.units.money})`,
      ],
      report.components.byRate.map((c) => [
        c.label,
        formatNumber(c.seedRate, 1),
        formatNumber(area(c.plantsPerSquareFoot), areaDigits),
        formatNumber(c.tillersPerPlant, 2),
        formatNumber(area(c.headsPerSquareFoot), areaDigits),
        formatNumber(c.yield, digits),
        formatNumber(c.seedReturn, 1),
        formatMoney(c.returnOverSeedCost),
      ]),
    ),
  );
  if (site.notes) parts.push(`<h2>Notes</h2><p>${esc(site.notes)}</p>`);
  return page(`${site.fieldName} — site report`, parts.join('\n'));
}

export async function pooledReportHtml(report: PooledReport): Promise<string> {
  const { trial, analysis } = report;
  const unit = trial.units.yield;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const label = (rate: string) => trial.rates.find((r) => r.key === rate)?.label ?? rate;
  const parts: string[] = [];
  parts.push(
    `<p class="eyebrow">Network report · ${esc(trial.cropName ?? '')} ${esc(trial.season ?? '')}</p><h1>${esc(trial.name)}</h1>`,
  );
  if (trial.question) parts.push(`<p><strong>Question:</strong> ${esc(trial.question)}</p>`);
  parts.push(
    `<h2>What the network found</h2><ul class="findings">${report.findings.map((f) => `<li>${esc(f)}</li>`).join('')}</ul>`,
  );
  parts.push('<h2>Sites</h2>');
  parts.push(
    table(
      ['Site', 'Soil', 'Previous crop', 'In the analysis'],
      [
        ...report.sitesIncluded.map((s) => [s.fieldName, s.soil, s.previousCrop, 'yes']),
        ...report.sitesExcluded.map((e) => [
          e.site.fieldName,
          e.site.soil,
          e.site.previousCrop,
          `no: ${e.reason}`,
        ]),
      ],
    ),
  );
  if (analysis) {
    const reference = label(analysis.reference);
    for (const difference of analysis.differences) {
      parts.push(
        await safeChart(
          forestSpec({
            rateLabel: label(difference.rate),
            referenceLabel: reference,
            yieldUnit: unit,
            sites: report.siteDifferences.filter((d) => d.rate === difference.rate),
            pooled: difference,
          }),
          `${label(difference.rate)} minus ${reference} at each site with its 95 % CI; the diamond is the pooled difference.`,
        ),
      );
    }
    parts.push(
      await safeChart(
        responseCurveSpec({
          points: report.siteMeans
            .filter((p) => p.seedRate !== null)
            .map((p) => ({ site: p.site, seedRate: p.seedRate as number, mean: p.mean })),
          curve: analysis.curve ?? null,
          agronomicOptimum: analysis.curve?.agronomicOptimum ?? null,
          economicOptimum: analysis.curve?.economicOptimum ?? null,
          seedUnit: trial.units.seed,
          yieldUnit: unit,
        }),
        'Site means by seeding rate with the fitted response curve and its optima.',
      ),
    );
    parts.push(
      `<h2>Combined analysis of variance</h2><p class="muted">Sites random: rate is tested against the site × rate interaction (${analysis.rateTest.df1} and ${analysis.rateTest.df2} df).</p>`,
    );
    parts.push(anovaTable(analysis.anova as never, digits));
    parts.push(
      table(
        ['Rate', `Mean over sites (${unit})`, '95 % CI'],
        analysis.means.map((m) => [
          label(m.rate),
          formatNumber(m.mean, digits),
          `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
        ]),
      ),
    );
    if (analysis.bartlett)
      parts.push(
        `<p>Homogeneity of site variances (Bartlett): χ² = ${formatNumber(analysis.bartlett.chiSquare, 2)} on ${analysis.bartlett.df} df, ${formatP(analysis.bartlett.p)}.</p>`,
      );
    if (report.economics.length > 0) {
      parts.push(
        `<h2>Economics</h2><p class="muted">Prices: ${pricesInWords(report.prices, reportDisplayUnits(trial.units, trial.crop))}.</p>`,
      );
      parts.push(
        table(
          [
            'Rate',
            `Seed cost (${trial.units.money})`,
            `Grain value (${trial.units.money})`,
            'Return over seed',
            `vs ${reference}`,
          ],
          report.economics.map((e) => [
            e.label,
            formatMoney(e.seedCost),
            formatMoney(e.grainValue),
            formatMoney(e.returnOverSeedCost),
            formatMoney(e.versusReference),
          ]),
        ),
      );
    }
  } else if (report.analysisError) {
    parts.push(`<p class="note">${esc(report.analysisError)}</p>`);
  }
  return page(`${trial.name} — network report`, parts.join('\n'));
}

const MAX_RENDERING = 2;
const MAX_WAITING = 4;
const RETRY_AFTER_SECONDS = 5;
const KEEP_STORED_MS = 30 * 24 * 60 * 60 * 1000;

let browser: Promise<Browser> | null = null;
let rendering = 0;
const waiting: (() => void)[] = [];
/** Same document asked for twice at once: print it once (keyed by the digest of its HTML). */
const inFlight = new Map<string, Promise<Buffer>>();
let renders = 0;

/** How many PDFs this process has printed with Chromium (tests check stored PDFs are reused). */
export function pdfRenderCount(): number {
  return renders;
}

/** One Chromium per process, started on first use and again if it crashes. */
function sharedBrowser(): Promise<Browser> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`Chromium is not installed at ${CHROMIUM}`);
  browser ??= chromium
    .launch({
      executablePath: CHROMIUM,
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
      ],
    })
    .then((launched) => {
      launched.on('disconnected', () => {
        browser = null;
      });
      return launched;
    })
    .catch((error: unknown) => {
      browser = null;
      throw error;
    });
  return browser;
}

/** Closes the shared browser (server shutdown, tests). */
export async function closePdfBrowser(): Promise<void> {
  const current = browser;
  browser = null;
  if (current) await (await current).close().catch(() => undefined);
}

/** Waits for one of the few rendering slots, or refuses at once when the queue is full. */
async function takeSlot(): Promise<void> {
  if (rendering < MAX_RENDERING) {
    rendering += 1;
    return;
  }
  if (waiting.length >= MAX_WAITING) throw new Busy(RETRY_AFTER_SECONDS);
  await new Promise<void>((resolve) => waiting.push(resolve));
}

function releaseSlot(): void {
  const next = waiting.shift();
  if (next) next();
  else rendering -= 1;
}

/** Builds the HTML and prints it, holding one of the few slots for both. */
async function render(html: () => Promise<string>): Promise<Buffer> {
  await takeSlot();
  try {
    const document = await html();
    const context = await (await sharedBrowser()).newContext({ javaScriptEnabled: false });
    try {
      const page = await context.newPage();
      await page.setContent(document, { waitUntil: 'load' });
      renders += 1;
      return await page.pdf({
        format: 'Letter',
        printBackground: true,
        margin: { top: '16mm', bottom: '16mm', left: '14mm', right: '14mm' },
      });
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    releaseSlot();
  }
}

/**
 * Prints a document to PDF through the process's one Chromium, at most two at a time with four
 * waiting (429 with Retry-After beyond that). A report printed before (same report data, same
 * day, as its printed date shows) is read back from PostgreSQL instead, without building its HTML.
 * The key is the report's ETag (its inputs and the reader's view), not the HTML: Vega's SVG
 * numbers its clip paths anew on every render, and two processes build equal reports.
 */
async function printOnce(
  kind: string,
  reportKey: string,
  html: () => Promise<string>,
  dataSource: DataSource,
): Promise<Buffer> {
  const digest = crypto
    .createHash('sha256')
    .update(`${kind}\n${new Date().toISOString().slice(0, 10)}\n${reportKey}`)
    .digest('hex');
  const stored = dataSource.getRepository(ReportPdf);
  const found = await stored.findOneBy({ digest });
  if (found) return found.pdf;
  let printing = inFlight.get(digest);
  if (!printing) {
    printing = render(html)
      .then(async (pdf) => {
        await stored.createQueryBuilder().insert().values({ digest, pdf }).orIgnore().execute();
        await stored.delete({ createdAt: LessThan(new Date(Date.now() - KEEP_STORED_MS)) });
        // Another process may have stored its print of the same report first: answer with the
        // stored copy, so every request for this report gets the same bytes.
        return (await stored.findOneBy({ digest }))?.pdf ?? pdf;
      })
      .finally(() => inFlight.delete(digest));
    inFlight.set(digest, printing);
  }
  return printing;
}

/** `etag` names the report's inputs and the reader's view (the report read's ETag). */
export function siteReportPdf(
  report: SiteReport,
  etag: string,
  dataSource: DataSource,
): Promise<Buffer> {
  return printOnce('site', etag, () => siteReportHtml(report), dataSource);
}

export function pooledReportPdf(
  report: PooledReport,
  etag: string,
  dataSource: DataSource,
): Promise<Buffer> {
  return printOnce('pooled', etag, () => pooledReportHtml(report), dataSource);
}
