// No user-supplied string reaches HTML unescaped: hostile text is stored through the API in every
// field a person can type (trial, rate label, site, seed, notes, strip notes, a CSV cell, a photo
// caption and file name, calibration note, reminder message, network and account names), then
// every page that shows it is opened in Chromium as the person who would see it. On each page no
// script ran (window.__xss stays unset, no dialog), no inline handler was merely blocked by the
// CSP (which would mean the markup was parsed as HTML), no injected <img src=x> was fetched, and
// the hostile text is on the page literally, so the check cannot pass by not showing it.
// The strips CSV export must defuse formula-like cells.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, clientFor, signIn, type BuiltNetwork, type Client } from '../helpers/app';
import {
  CONTEXT_DEFAULTS,
  launchBrowser,
  screenshot,
  signInThroughUi,
  startTestServer,
} from '../helpers/browser';
import { buildActiveTrial } from '../api/trials/builders';
import { pooledReportHtml, siteReportHtml } from '../../api/reports/reports.pdf';

// Source: OWASP XSS Filter Evasion Cheat Sheet (script tag, img onerror, attribute break-out with
// svg onload, iframe srcdoc) and OWASP "CSV Injection" (the DDE payload =cmd|' /C calc'!A0).
const SCRIPT = '<script>window.__xss=1</script>';
const IMG = '<img src=x onerror="window.__xss=1">';
const SVG = '"><svg onload=window.__xss=1>';
const IFRAME = '<iframe srcdoc="<script>parent.__xss=1</script>">';
const FORMULA = "=cmd|' /C calc'!A0";

/** One distinct hostile value per field, so a page's text shows which field it printed. */
const S = {
  network: `${IMG} Net`,
  trialName: `Oats ${SCRIPT}`,
  question: `${IMG} does less seed pay?`,
  rateLabel: `half${SVG}`,
  field: `${FORMULA} ${SVG}`,
  field2: `Second ${IFRAME}`,
  soil: `${IMG}loam`,
  previousCrop: `+peas${SCRIPT}`,
  fertility: `${SVG} 40 N`,
  siteNotes: `${SCRIPT} site notes`,
  seed: `${SCRIPT}seed`,
  stripNotes: `@SUM(1+1)${IMG} strip note`,
  csvNotes: `-2+3${SVG} imported`,
  caption: `${IMG} caption`,
  fileName: `<svg onload=window.__xss=1>.png`,
  calibration: `${SCRIPT} calibration`,
  reminder: `${IMG} reminder`,
  growerName: `-${IMG} Gwen`,
  filter: `${SVG}clay`,
};

// A minimal valid PNG (one pixel): Common practice, no published source.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
);
const PASSWORD = 'hostile-grower-password';

/**
 * A multipart POST with the CSRF header. (The helper's `upload()` is an async function returning
 * the supertest request, and awaiting it sends the request before a file can be attached.)
 */
async function multipart(client: Client, url: string) {
  const token = await client.csrf();
  // Wrapped so that awaiting this function does not send the request.
  return { request: client.agent.post(url).set('X-CSRF-Token', token) };
}

/** Hostile tags that appear as real markup (not escaped) in an HTML string. */
function rawMarkup(html: string): string[] {
  return html.match(/<script>window|<img src=x|<svg onload|<iframe srcdoc/gi) ?? [];
}

interface Findings {
  xss: unknown;
  dialogs: string[];
  csp: string[];
  fetchedX: string[];
  errors: string[];
}

describe('no user-supplied string reaches HTML unescaped', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser;
  let net: BuiltNetwork;
  let coordinator: Client;
  let trialId: string;
  let site1: string;
  let site2: string;
  let strip1: string;
  let shareToken: string;
  let openInviteToken: string;
  let invitedEmail: string;

  async function ok<T extends { status: number; body: unknown; text?: string }>(
    what: string,
    res: Promise<T> | T,
    status = 200,
  ): Promise<T> {
    const r = await res;
    if (r.status !== status)
      throw new Error(`${what}: ${r.status} ${r.text ?? JSON.stringify(r.body)}`);
    return r;
  }

  async function tokenFor(email: string): Promise<string> {
    const mail = (await server.testApp.mailCatcher.list()).find((m) => m.to.includes(email));
    const token = mail && /\/invite\/([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
    if (!token) throw new Error(`no invitation mail for ${email}`);
    return token;
  }

  /** Fills a site's template with yields (and the hostile notes cell) and uploads it. */
  async function importData(client: Client, siteId: string, shift: number, notes: string | null) {
    const template = await ok('template', client.get(`/api/sites/${siteId}/import-template.csv`));
    const table = Papa.parse<string[]>(template.text.replace(/^\uFEFF/, ''), {
      skipEmptyLines: true,
    }).data;
    const header = table[0]!;
    const col = (name: string) => {
      const i = header.indexOf(name);
      if (i < 0) throw new Error(`template has no ${name} column: ${header.join(',')}`);
      return i;
    };
    table.slice(1).forEach((row, i) => {
      const block = Number(row[col('block')]);
      const rate = row[col('rate')]!;
      const byRate = rate.startsWith('half') ? 0 : rate === 'full' ? 1 : 2;
      // Invented yields: rises with rate, differs by block and site, a little noise.
      row[col('grain_weight_lb')] = (
        7 +
        byRate * 0.6 +
        block * 0.2 +
        shift +
        ((i * 37) % 7) * 0.05
      ).toFixed(2);
      row[col('harvest_rows')] = '4';
      row[col('harvest_length_ft')] = '40';
      row[col('moisture_pct')] = '14';
      row[col('stand_1')] = String(20 + byRate * 6 + block);
      row[col('stand_row_length_ft')] = '3';
      if (notes && i === 1) row[col('notes')] = notes;
    });
    const csv = Papa.unparse({ fields: header, data: table.slice(1) }, { newline: '\r\n' });
    await ok(
      'import',
      (await multipart(client, `/api/sites/${siteId}/import`)).request.attach(
        'file',
        Buffer.from(csv, 'utf8'),
        { filename: 'strips.csv', contentType: 'text/csv' },
      ),
    );
  }

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
    const { app, dataSource } = server.testApp;
    net = await buildNetwork(dataSource, S.network);
    coordinator = await signIn(app, net.emails.coordinator);
    const grower = await signIn(app, net.emails.grower);

    trialId = await buildActiveTrial(coordinator, net.networkId, {
      name: S.trialName,
      question: S.question,
      rateLevels: [
        { multiplier: 0.5, label: S.rateLabel },
        { multiplier: 1, label: 'full' },
        { multiplier: 2, label: 'double' },
      ],
      blocksPerSite: 3,
    });

    const s1 = await ok(
      'enrol site 1',
      coordinator.post(`/api/trials/${trialId}/sites`, {
        growerUserId: net.userIds.grower,
        fieldName: S.field,
        soil: S.soil,
        previousCrop: S.previousCrop,
        fertility: S.fertility,
        notes: S.siteNotes,
      }),
      201,
    );
    site1 = s1.body.id;
    invitedEmail = `hostile-${net.suffix}@test.example`;
    const s2 = await ok(
      'enrol site 2',
      coordinator.post(`/api/trials/${trialId}/sites`, {
        growerEmail: invitedEmail,
        fieldName: S.field2,
        soil: 'loam',
        previousCrop: 'peas',
      }),
      201,
    );
    site2 = s2.body.id;
    await ok('randomize 1', coordinator.post(`/api/sites/${site1}/randomize`, { seed: S.seed }));
    await ok('randomize 2', coordinator.post(`/api/sites/${site2}/randomize`, {}));

    // The invited grower accepts with a hostile name; a second invitation stays open for its page.
    const invited = clientFor(app);
    await ok(
      'accept',
      invited.post('/api/invitations/accept', {
        token: await tokenFor(invitedEmail),
        name: S.growerName,
        password: PASSWORD,
      }),
    );
    const memberEmail = `hostile-member-${net.suffix}@test.example`;
    await ok(
      'invite member',
      coordinator.post(`/api/networks/${net.networkId}/invitations`, {
        email: memberEmail,
        role: 'member',
      }),
      201,
    );
    openInviteToken = await tokenFor(memberEmail);

    await importData(grower, site1, 0, S.csvNotes);
    await importData(invited, site2, 0.4, null);
    const strips = await ok('strips', grower.get(`/api/sites/${site1}/strips`));
    strip1 = strips.body.strips[0].stripId;
    const version = strips.body.strips[0].version;
    await ok(
      'strip notes',
      grower.patch(`/api/strips/${strip1}`, { version, values: { notes: S.stripNotes } }),
    );
    await ok(
      'photo',
      (await multipart(grower, `/api/sites/${site1}/photos`)).request
        .field('caption', S.caption)
        .field('stripId', strip1)
        .attach('file', PNG, { filename: S.fileName, contentType: 'image/png' }),
      201,
    );
    await ok(
      'calibration',
      grower.post(`/api/sites/${site1}/calibrations`, {
        wheelCircumferenceFt: 6,
        turns: 10,
        seedsCounted: 900,
        targetSeedsPerFt: 15,
        rowSpacingIn: 8,
        rateLabel: 'full',
        note: S.calibration,
      }),
      201,
    );
    await ok(
      'reminders',
      coordinator.post(`/api/trials/${trialId}/reminders`, { message: S.reminder }),
    );
    await ok('publish pooled', coordinator.post(`/api/trials/${trialId}/publish`));
    const link = await ok(
      'public link',
      coordinator.post(`/api/trials/${trialId}/public-link`, { enabled: true }),
    );
    shareToken = link.body.token;
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  /** A context whose pages record script runs, dialogs, CSP violations and fetches of `x`. */
  async function openAs(
    email: string | null,
    password?: string,
  ): Promise<{
    context: BrowserContext;
    page: Page;
    findings: () => Promise<Findings>;
    reset: () => void;
  }> {
    const context = await browser.newContext({
      viewport: { width: 1280, height: 900 },
      ...CONTEXT_DEFAULTS,
    });
    await context.addInitScript(() => {
      const w = window as unknown as { __csp: string[] };
      w.__csp = [];
      document.addEventListener('securitypolicyviolation', (e) =>
        w.__csp.push(`${e.violatedDirective}: ${e.sample || e.blockedURI}`),
      );
    });
    const page = await context.newPage();
    const dialogs: string[] = [];
    const csp: string[] = [];
    const fetchedX: string[] = [];
    const errors: string[] = [];
    page.on('dialog', (d) => {
      dialogs.push(`${d.type()}: ${d.message()}`);
      void d.dismiss();
    });
    page.on('console', (m) => {
      if (/Content Security Policy/i.test(m.text())) csp.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('request', (r) => {
      if (/\/x$/.test(new URL(r.url()).pathname)) fetchedX.push(r.url());
    });
    if (email) await signInThroughUi(page, server.baseUrl, email, password);
    return {
      context,
      page,
      reset: () => {
        dialogs.length = 0;
        csp.length = 0;
        fetchedX.length = 0;
        errors.length = 0;
      },
      findings: async () => {
        const inPage = await page.evaluate(() => {
          const w = window as unknown as { __xss?: unknown; __csp: string[] };
          return { xss: w.__xss, csp: w.__csp };
        });
        // zod 4 probes `new Function("")` once (util.allowsEval) and swallows the refusal; that
        // 'eval' report is not injected markup. Every inline script or handler report counts.
        const injected = [...csp, ...inPage.csp].filter((v) => !/: eval$|unsafe-eval/.test(v));
        return {
          xss: inPage.xss,
          dialogs: [...dialogs],
          csp: injected,
          fetchedX: [...fetchedX],
          errors: [...errors],
        };
      },
    };
  }

  /** Everything a reader can see: text, form values, SVG labels (charts) and the title. */
  async function visibleText(page: Page): Promise<string> {
    return page.evaluate(() => {
      const parts = [document.title, document.body.innerText];
      document
        .querySelectorAll('input, textarea, select')
        .forEach((el) => parts.push((el as HTMLInputElement).value));
      document.querySelectorAll('svg text').forEach((el) => parts.push(el.textContent ?? ''));
      return parts.join('\n');
    });
  }

  /** Opens a page, waits for the expected hostile strings to show, then checks nothing ran. */
  async function check(
    session: Awaited<ReturnType<typeof openAs>>,
    url: string,
    expected: string[],
    before?: (page: Page) => Promise<void>,
  ) {
    const { page } = session;
    session.reset();
    await page.goto(`${server.baseUrl}${url}`);
    await page.waitForLoadState('networkidle');
    if (before) await before(page);
    try {
      await page.waitForFunction(
        (wanted) => {
          const parts = [document.title, document.body.innerText];
          document
            .querySelectorAll('input, textarea, select')
            .forEach((el) => parts.push((el as HTMLInputElement).value));
          document.querySelectorAll('svg text').forEach((el) => parts.push(el.textContent ?? ''));
          const text = parts.join('\n');
          return wanted.every((w) => text.includes(w));
        },
        expected,
        { timeout: 15_000 },
      );
    } catch {
      const text = await visibleText(page);
      const missing = expected.filter((e) => !text.includes(e));
      await screenshot(page, `xss-missing-${url.replace(/[^a-z0-9]+/gi, '-')}`);
      expect(missing, `${url} does not show these hostile strings literally`).toEqual([]);
    }
    // Give late handlers (image errors, chart renders) a moment to fire.
    await page.waitForTimeout(400);
    const findings = await session.findings();
    expect({ url, ...findings, errors: [] }).toEqual({
      url,
      xss: undefined,
      dialogs: [],
      csp: [],
      fetchedX: [],
      errors: [],
    });
    return page;
  }

  it('detects markup that is parsed as HTML (control: the checks can fail)', async () => {
    const session = await openAs(net.emails.coordinator);
    await session.page.goto(`${server.baseUrl}/trials/${trialId}`);
    await session.page.waitForLoadState('networkidle');
    session.reset();
    // What an unescaped sink would do with the stored trial name and question.
    await session.page.evaluate(
      (html) => document.body.insertAdjacentHTML('beforeend', html),
      `${S.question}${S.rateLabel}`,
    );
    await session.page.waitForTimeout(400);
    const findings = await session.findings();
    expect(findings.csp.length).toBeGreaterThan(0);
    expect(findings.fetchedX.length).toBeGreaterThan(0);
    await session.context.close();
  });

  it('shows hostile strings as text on every coordinator page', async () => {
    const session = await openAs(net.emails.coordinator);
    const pages: [string, string[]][] = [
      ['/', [S.trialName]],
      [
        `/trials/${trialId}`,
        [S.trialName, S.question, S.rateLabel, S.field, S.field2, S.growerName],
      ],
      [`/trials/${trialId}/edit`, [S.trialName, S.question]],
      [`/trials/${trialId}/progress`, [S.field, S.field2, S.growerName]],
      [`/sites/${site1}`, [S.field, S.rateLabel]],
      [`/sites/${site1}/strips/${strip1}`, [S.field, S.stripNotes, S.caption]],
      [`/sites/${site1}/grid`, [S.field, S.rateLabel, S.stripNotes, S.csvNotes]],
      [
        // The history tells changes in plain words; the notes it quotes appear as text.
        `/sites/${site1}/history`,
        [S.stripNotes, S.csvNotes],
      ],
      [`/sites/${site1}/photos`, [S.caption]],
      [`/sites/${site1}/import`, [S.field]],
      [`/sites/${site1}/map`, [S.field, S.rateLabel, S.seed]],
      [`/sites/${site1}/packet`, [S.trialName, S.field, S.rateLabel, S.seed]],
      [
        `/sites/${site1}/report`,
        [
          S.question,
          S.field,
          S.soil,
          S.previousCrop,
          S.siteNotes,
          S.stripNotes,
          S.csvNotes,
          S.caption,
        ],
      ],
      [`/sites/${site2}`, [S.field2]],
      [`/trials/${trialId}/report`, [S.trialName, S.question, S.field, S.field2]],
      // Reflected: a filter value from the address bar is echoed in the reasons a site is left out.
      [`/trials/${trialId}/report?soil=${encodeURIComponent(S.filter)}`, [S.trialName, S.filter]],
    ];
    for (const [url, expected] of pages) await check(session, url, expected);

    // The meeting view shows one slide at a time: walk them all, checking after each.
    const page = await check(session, `/trials/${trialId}/meeting`, [S.trialName]);
    const counter = page.getByTestId('slide-counter');
    const total = Number((await counter.textContent())!.split('/')[1]);
    expect(total).toBeGreaterThanOrEqual(4);
    let seen = await visibleText(page);
    for (let slide = 2; slide <= total; slide += 1) {
      await page.keyboard.press('ArrowRight');
      await expect
        .poll(async () => (await counter.textContent())!.trim())
        .toBe(`${slide} / ${total}`);
      await page.waitForTimeout(300);
      seen += await visibleText(page);
    }
    for (const text of [S.question, S.rateLabel, S.field, S.field2, S.soil, S.previousCrop])
      expect(seen).toContain(text);
    expect(await session.findings()).toEqual({
      xss: undefined,
      dialogs: [],
      csp: [],
      fetchedX: [],
      errors: [],
    });
    await screenshot(page, 'xss-meeting');
    await check(session, `/sites/${site1}/report`, [S.field, S.stripNotes]);
    await screenshot(session.page, 'xss-site-report');
    await session.context.close();
  }, 240_000);

  it('shows hostile strings as text on the pages a grower opens', async () => {
    const session = await openAs(net.emails.grower);
    await check(session, '/', [S.field]);
    await check(session, `/sites/${site1}`, [S.field, S.rateLabel]);
    await check(session, `/sites/${site1}/strips/${strip1}`, [S.stripNotes, S.caption]);
    await check(session, `/sites/${site1}/grid`, [S.stripNotes, S.csvNotes]);
    await session.context.close();

    const hostile = await openAs(invitedEmail, PASSWORD);
    await check(hostile, '/', [S.field2, S.growerName]);
    await check(hostile, `/sites/${site2}`, [S.field2]);
    await hostile.context.close();
  }, 120_000);

  it('shows hostile strings as text on the public link and the invitation page', async () => {
    const session = await openAs(null);
    // Growers here have not chosen to be named: the public report shows neutral farm labels.
    await check(session, `/shared/${shareToken}`, [
      S.trialName,
      S.question,
      S.rateLabel,
      S.soil,
      S.previousCrop,
    ]);
    const shared = await visibleText(session.page);
    expect(shared).not.toContain(S.field);
    expect(shared).not.toContain(S.field2);
    await check(session, `/invite/${openInviteToken}`, [S.network]);
    await session.context.close();
  });

  it('shows hostile strings as text in caught e-mail', async () => {
    const session = await openAs(net.emails.admin);
    await check(session, '/admin/mail', [S.trialName], async (page) => {
      // Messages are collapsed; open them all so their text is rendered.
      for (const summary of await page.locator('details > summary').all()) await summary.click();
    });
    const text = await visibleText(session.page);
    expect(text).toContain(S.network);
    expect(text).toContain(S.reminder);
    await session.context.close();
    // The HTML part of every message escapes what it quotes.
    const sent = (await server.testApp.mailCatcher.list()).filter((m) =>
      m.to.some((to) => to.endsWith(`${net.suffix}@test.example`)),
    );
    expect(sent.length).toBeGreaterThanOrEqual(3);
    for (const mail of sent) expect(rawMarkup(mail.html ?? ''), mail.subject).toEqual([]);
  });

  it('escapes hostile strings in the HTML the PDF exports are printed from', async () => {
    const site = await ok('site report', coordinator.get(`/api/sites/${site1}/report`));
    const pooled = await ok(
      'pooled report',
      coordinator.get(`/api/trials/${trialId}/pooled-report?soil=${encodeURIComponent(S.filter)}`),
    );
    const siteHtml = await siteReportHtml(site.body);
    const pooledHtml = await pooledReportHtml(pooled.body);
    // The strings are in the documents, escaped, and no tag they carry survived as markup.
    expect(siteHtml).toContain('&lt;script&gt;window.__xss=1&lt;/script&gt; site notes');
    expect(pooledHtml).toContain('Oats &lt;script&gt;window.__xss=1&lt;/script&gt;');
    expect(rawMarkup(siteHtml)).toEqual([]);
    expect(rawMarkup(pooledHtml)).toEqual([]);
  });

  it('defuses formula-like cells in the strips CSV export', async () => {
    const res = await ok('export', coordinator.get(`/api/trials/${trialId}/export.csv`));
    const rows = Papa.parse<string[]>(res.text.replace(/^\uFEFF/, ''), {
      skipEmptyLines: true,
    }).data;
    const header = rows[0]!;
    const body = rows.slice(1);
    expect(body.length).toBe(18);
    // Source: OWASP "CSV Injection": cells starting with = + - @ tab or CR run as formulas.
    const dangerous = body
      .flat()
      .filter((cell) => /^[=+\-@\t\r]/.test(cell) && !/^-?\d+(\.\d+)?(e-?\d+)?$/.test(cell));
    expect(dangerous).toEqual([]);
    const cell = (row: string[], name: string) => row[header.indexOf(name)]!;
    expect(body.map((r) => cell(r, 'field'))).toContain(`'${S.field}`);
    expect(body.map((r) => cell(r, 'grower'))).toContain(`'${S.growerName}`);
    expect(body.map((r) => cell(r, 'previous_crop'))).toContain(`'${S.previousCrop}`);
    expect(body.map((r) => cell(r, 'notes'))).toEqual(
      expect.arrayContaining([`'${S.stripNotes}`, `'${S.csvNotes}`]),
    );
    expect(body.map((r) => cell(r, 'rate_label'))).toContain(S.rateLabel);
  });
});
