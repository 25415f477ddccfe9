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
  squaredDecimals,
} from '../../shared/reports/format-numbers';
import { networkComparisons, rateName, siteComparisons } from '../../shared/reports/findings';
import {
  comparisonVerdict,
  intervalKindWords,
  signedNumber,
  verdictWords,
  type Comparison,
} from '../../shared/reports/plain-words';
import { PRINT } from '../../shared/brand/colours';
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

/** The print styles; every colour is a PRINT token from shared/brand/colours.ts. */
export const PDF_STYLE = `
  @page { size: Letter; margin: 16mm 14mm; }
  body { font-family: 'Inter Variable', Inter, 'DejaVu Sans', Arial, sans-serif; color: ${PRINT.ink}; background: ${PRINT.paper}; font-size: 10.5pt; line-height: 1.45; }
  h1 { font-size: 19pt; margin: 0 0 2pt; color: ${PRINT.heading}; }
  h2 { font-size: 13pt; margin: 16pt 0 6pt; border-bottom: 1.5pt solid ${PRINT.rule}; padding-bottom: 2pt; break-after: avoid; }
  h3 { font-size: 10.5pt; margin: 10pt 0 4pt; break-after: avoid; }
  .eyebrow { text-transform: uppercase; letter-spacing: .08em; font-size: 8.5pt; color: ${PRINT.eyebrow}; font-weight: 700; }
  .muted { color: ${PRINT.muted}; }
  dl { display: grid; grid-template-columns: max-content 1fr max-content 1fr; gap: 2pt 10pt; margin: 8pt 0; }
  dt { font-weight: 600; color: ${PRINT.muted}; } dd { margin: 0; }
  ul.findings li { margin-bottom: 4pt; }
  table { border-collapse: collapse; width: 100%; margin: 4pt 0 8pt; font-size: 9.5pt; break-inside: avoid; }
  caption { text-align: left; font-weight: 600; padding-bottom: 2pt; }
  th, td { border-bottom: 0.75pt solid ${PRINT.line}; padding: 3pt 5pt; text-align: right; font-variant-numeric: tabular-nums; }
  th:first-child, td:first-child { text-align: left; }
  th { background: ${PRINT.headerGround}; font-weight: 650; }
  figure { margin: 6pt 0 10pt; break-inside: avoid; } figcaption { font-size: 8.5pt; color: ${PRINT.muted}; }
  svg { max-width: 100%; height: auto; }
  .note { border-left: 3pt solid ${PRINT.noteRule}; padding: 4pt 8pt; background: ${PRINT.noteGround}; margin: 6pt 0; }
  .statistician { break-before: page; font-size: 9.5pt; }
  .statistician ul li { margin-bottom: 3pt; }
  footer { margin-top: 14pt; font-size: 8pt; color: ${PRINT.muted}; }
`;

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><style>${PDF_STYLE}</style></head><body>${body}<footer>Printed from Sheaf on ${new Date().toISOString().slice(0, 10)}. Seeding rates in a trial are treatments to compare, not recommendations; follow local extension advice and the seed label.</footer></body></html>`;
}

function table(head: string[], rows: (string | number)[][], caption?: string): string {
  return `<table>${caption ? `<caption>${esc(caption)}</caption>` : ''}<thead><tr>${head.map((h) => `<th>${esc(h)}</th>`).join('')}</tr></thead><tbody>${rows
    .map((r) => `<tr>${r.map((c) => `<td>${esc(String(c))}</td>`).join('')}</tr>`)
    .join('')}</tbody></table>`;
}

const pCell = (p: number | undefined) =>
  p === undefined ? '' : formatP(p).replace('p = ', '').replace('p < ', '< ');
const interval = (low: number, high: number, digits: number) =>
  `${signedNumber(low, digits)} to ${signedNumber(high, digits)}`;
const list = (items: readonly string[], className = '') =>
  `<ul${className ? ` class="${className}"` : ''}>${items.map((f) => `<li>${esc(f)}</li>`).join('')}</ul>`;

const SOURCES: Record<string, string> = {
  block: 'Blocks',
  rate: 'Seeding rate',
  error: 'Error (strips)',
  total: 'Total',
  site: 'Sites',
  'block(site)': 'Blocks within sites',
  'site:rate': 'Site × rate',
};

function anovaTable(
  rows: { source: string; df: number; ss: number; ms?: number; f?: number; p?: number }[],
  digits: number,
  caption = 'Analysis of variance',
): string {
  return table(
    ['Source', 'df', 'Sum of squares', 'Mean square', 'F', 'p'],
    rows.map((r) => [
      SOURCES[r.source] ?? r.source,
      r.df,
      formatNumber(r.ss, squaredDecimals(digits)),
      r.ms === undefined ? '' : formatNumber(r.ms, squaredDecimals(digits)),
      r.f === undefined ? '' : formatNumber(r.f, 2),
      pCell(r.p),
    ]),
    caption,
  );
}

/** Differences from the reference for the grower: the interval said as what it is, and a verdict. */
function plainDifferences(
  comparisons: readonly Comparison[],
  rates: readonly string[],
  label: (rate: string) => string,
  unit: string,
  digits: number,
): string {
  const kind = comparisons[0]?.kind ?? 'dunnett';
  return table(
    ['Rate', `Difference (${unit})`, `95 % interval, ${intervalKindWords(kind)}`, 'What it means'],
    comparisons.map((c, i) => [
      label(rates[i] ?? ''),
      signedNumber(c.estimate, digits),
      interval(c.low, c.high, digits),
      verdictWords(comparisonVerdict(c), c.reference),
    ]),
    `Difference from the ${comparisons[0]?.reference ?? 'reference rate'}`,
  );
}

/** Differences for the statistician: each test alone, and Dunnett's when computed. */
function detailDifferences(
  rows: readonly {
    rate: string;
    estimate: number;
    se: number;
    ciLow: number;
    ciHigh: number;
    p: number;
    ciLowAdjusted?: number;
    ciHighAdjusted?: number;
    pAdjusted?: number;
  }[],
  label: (rate: string) => string,
  unit: string,
  digits: number,
  caption: string,
): string {
  const adjusted = rows.some((r) => r.pAdjusted !== undefined);
  return table(
    [
      'Rate',
      `Difference (${unit})`,
      'Standard error',
      '95 % interval, one comparison',
      'p, one comparison',
      ...(adjusted ? ['95 % interval, Dunnett', 'p, Dunnett'] : []),
    ],
    rows.map((r) => [
      label(r.rate),
      signedNumber(r.estimate, digits),
      formatNumber(r.se, digits + 1),
      interval(r.ciLow, r.ciHigh, digits),
      pCell(r.p),
      ...(adjusted
        ? [
            r.ciLowAdjusted === undefined || r.ciHighAdjusted === undefined
              ? '–'
              : interval(r.ciLowAdjusted, r.ciHighAdjusted, digits),
            pCell(r.pAdjusted),
          ]
        : []),
    ]),
    caption,
  );
}

/** The statistician's part: the notes, then the tables, on a page of its own. */
function statisticianPart(notes: readonly string[], tables: readonly string[]): string {
  if (notes.length === 0 && tables.length === 0) return '';
  return `<section class="statistician"><h2>For the statistician</h2><p class="muted">The tests behind the plain words above: F tests and their degrees of freedom, p-values with and without adjustment for comparing several rates, and the residual checks.</p>${list(notes)}${tables.join('\n')}</section>`;
}

export async function siteReportHtml(report: SiteReport): Promise<string> {
  const { site, analysis } = report;
  const unit = site.units.yield;
  const { perArea } = reportDisplayUnits(site.units, site.crop);
  const area = (value: number | null) => (value === null ? null : perArea.fromStored(value));
  const areaDigits = perArea.unit === 'm²' ? 0 : 1;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const label = (rate: string) => site.design.rates.find((r) => r.key === rate)?.label ?? rate;
  const name = (rate: string) => rateName(label(rate));
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
  parts.push(`<h2>What this site found</h2>${list(report.findings, 'findings')}`);
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
        'Rate means with 95 % intervals, each rate on its own (filled), and the individual strips (open).',
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
    parts.push(
      `<h2>The numbers</h2><p class="muted">Average over every strip ${formatNumber(analysis.grandMean, digits)} ${esc(unit)}. A rate “clearly” differs from the ${esc(name(analysis.reference))} only when its whole interval in the difference table is on one side of zero; those intervals are Dunnett-adjusted: they allow for comparing every rate with it at once.</p>`,
    );
    parts.push(
      table(
        ['Rate', 'Strips', `Mean (${unit})`, '95 % interval, this rate alone'],
        analysis.means.map((m) => [
          label(m.rate),
          m.n,
          formatNumber(m.mean, digits),
          `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
        ]),
        'Rate means',
      ),
    );
    parts.push(
      plainDifferences(
        siteComparisons(analysis, name),
        analysis.differences.map((d) => d.rate),
        label,
        unit,
        digits,
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
  if (analysis) {
    parts.push(
      statisticianPart(report.forStatistician ?? analysis.notes, [
        anovaTable(analysis.anova as never, digits),
        `<p>LSD (5 %) ${formatNumber(analysis.lsd, digits)}; Tukey HSD ${formatNumber(analysis.hsd, digits)}. Rates sharing a Tukey group letter are not detectably different by Tukey’s test.</p>`,
        table(
          [
            'Rate',
            `Mean (${unit})`,
            'Standard error',
            '95 % interval, this rate alone',
            'Tukey group',
          ],
          analysis.means.map((m) => [
            label(m.rate),
            formatNumber(m.mean, digits),
            formatNumber(m.se, digits + 1),
            `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
            m.group,
          ]),
          'Rate means with standard errors and Tukey groups',
        ),
        detailDifferences(
          analysis.differences.map((d) => ({ ...d, estimate: d.diff })),
          label,
          unit,
          digits,
          `Difference from the ${name(analysis.reference)}: one comparison and all comparisons`,
        ),
      ]),
    );
  }
  return page(`${site.fieldName} — site report`, parts.join('\n'));
}

/** The network's grower part after the findings: charts, expected yields, differences, economics. */
async function pooledGrowerPart(
  report: PooledReport,
  analysis: NonNullable<PooledReport['analysis']>,
): Promise<string[]> {
  const { trial } = report;
  const unit = trial.units.yield;
  const digits = decimalsFor(analysis.grandMean);
  const label = (rate: string) => trial.rates.find((r) => r.key === rate)?.label ?? rate;
  const reference = label(analysis.reference);
  const parts: string[] = [];
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
        `${label(difference.rate)} minus ${reference} at each site with its 95 % interval (that site on its own, not adjusted); the diamond is the pooled difference.`,
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
  const mixed = analysis.mixed;
  if (mixed) {
    parts.push(
      `<h2>Expected yield at a farm like these</h2><p class="muted">${esc(mixed.captions.means)}</p>`,
    );
    parts.push(
      table(
        ['Rate', `Mean (${unit})`, '95 % interval, a farm like these'],
        mixed.means.map((m) => [
          label(m.rate),
          formatNumber(m.mean, digits),
          `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
        ]),
      ),
    );
  }
  parts.push(
    plainDifferences(
      networkComparisons(analysis, (rate) => rateName(label(rate))),
      analysis.differences.map((d) => d.rate),
      label,
      unit,
      digits,
    ),
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
  return parts;
}

/** The network's statistician part: combined ANOVA, comparison means and both kinds of p. */
function pooledStatisticianPart(
  report: PooledReport,
  analysis: NonNullable<PooledReport['analysis']>,
): string {
  const { trial } = report;
  const unit = trial.units.yield;
  const digits = decimalsFor(analysis.grandMean);
  const label = (rate: string) => trial.rates.find((r) => r.key === rate)?.label ?? rate;
  const reference = rateName(label(analysis.reference));
  const tables = [
    `<h3>Combined analysis of variance</h3><p class="muted">Sites random: rate is tested against the site × rate interaction (${analysis.rateTest.df1} and ${analysis.rateTest.df2} df).</p>`,
    anovaTable(analysis.anova as never, digits, 'Combined analysis of variance'),
    table(
      ['Rate', `Mean over sites (${unit})`, '95 % interval for comparing rates'],
      analysis.means.map((m) => [
        label(m.rate),
        formatNumber(m.mean, digits),
        `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
      ]),
      'Rate means over sites (tested against site × rate)',
    ),
    detailDifferences(
      analysis.differences.map((d) => ({ ...d, estimate: d.diff })),
      label,
      unit,
      digits,
      `Combined analysis: difference from the ${reference}, each comparison on its own`,
    ),
  ];
  if (analysis.mixed)
    tables.push(
      detailDifferences(
        analysis.mixed.differences,
        label,
        unit,
        digits,
        `Mixed model (Kenward–Roger df): difference from the ${reference}, one comparison and all comparisons`,
      ),
    );
  return statisticianPart(report.forStatistician ?? [], tables);
}

export async function pooledReportHtml(report: PooledReport): Promise<string> {
  const { trial, analysis } = report;
  const parts: string[] = [];
  parts.push(
    `<p class="eyebrow">Network report · ${esc(trial.cropName ?? '')} ${esc(trial.season ?? '')}</p><h1>${esc(trial.name)}</h1>`,
  );
  if (trial.question) parts.push(`<p><strong>Question:</strong> ${esc(trial.question)}</p>`);
  parts.push(`<h2>What the network found</h2>${list(report.findings, 'findings')}`);
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
    parts.push(...(await pooledGrowerPart(report, analysis)));
    parts.push(pooledStatisticianPart(report, analysis));
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
