// PDF printing goes through one shared Chromium with a small bounded queue (429 with
// Retry-After beyond it), and a repeated request for an unchanged report reuses the stored PDF.
import fs from 'node:fs';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorHandler } from '../../../api/middleware/error-handler';
import { Busy } from '../../../api/errors';
import { closePdfBrowser, siteReportPdf } from '../../../api/reports/reports.pdf';
import { createTestApp, demoIds, signIn, type Client, type TestApp } from '../../helpers/app';

/** Processes descended from this test process whose command name mentions Chromium. */
function chromiumDescendants(): number {
  const parents = new Map<number, number>();
  const names = new Map<number, string>();
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      const close = stat.lastIndexOf(')');
      names.set(Number(entry), stat.slice(stat.indexOf('(') + 1, close));
      parents.set(Number(entry), Number(stat.slice(close + 2).split(' ')[1]));
    } catch {
      // The process ended while we looked.
    }
  }
  let count = 0;
  for (const [pid, name] of names) {
    if (!/chrom/i.test(name)) continue;
    for (let up = parents.get(pid); up !== undefined && up > 1; up = parents.get(up)) {
      if (up === process.pid) {
        count += 1;
        break;
      }
    }
  }
  return count;
}

const binary = (res: import('supertest').Response) => res.body as Buffer;

describe('PDF printing queue', () => {
  let t: TestApp;
  let coordinator: Client;
  let siteIds: string[];
  beforeAll(async () => {
    t = await createTestApp();
    coordinator = await signIn(t.app, 'coordinator@millbrook.example');
    siteIds = (await demoIds(t.dataSource)).sites.map((s) => s.id);
  });
  afterAll(async () => {
    await closePdfBrowser();
    await t.close();
  });

  const getPdf = (url: string) =>
    coordinator.agent
      .get(url)
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });

  it('prints eight reports at once with one browser, refusing the overflow with Retry-After', async () => {
    expect(siteIds).toHaveLength(8);
    // The eight reports' data, read first, so the printing below is all that runs at once.
    const reports = await Promise.all(
      siteIds.map(async (id) => (await coordinator.get(`/api/sites/${id}/report`)).body),
    );
    await t.dataSource.query('DELETE FROM report_pdfs');
    // Open this process's database connections before the burst (slow on a loaded machine).
    await Promise.all(Array.from({ length: 5 }, () => t.dataSource.query('SELECT pg_sleep(0.05)')));
    let most = 0;
    const watch = setInterval(() => (most = Math.max(most, chromiumDescendants())), 100);
    // Six fill the two printing slots and the four waiting places; the next two are refused.
    const outcomes = await Promise.allSettled(
      reports.map((report, i) => siteReportPdf(report, `burst-${i}`, t.dataSource)),
    );
    clearInterval(watch);
    const printed = outcomes.flatMap((o) => (o.status === 'fulfilled' ? [o.value] : []));
    const refused = outcomes.flatMap((o) => (o.status === 'rejected' ? [o.reason] : []));
    expect(printed).toHaveLength(6);
    expect(refused).toHaveLength(2);
    for (const error of refused) {
      expect(error).toBeInstanceOf(Busy);
      expect(error.retryAfterSeconds).toBeGreaterThan(0);
    }
    for (const pdf of printed) expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    // One Chromium is a handful of processes (browser, zygotes, utility, renderers); a browser
    // per request made 87 for eight requests. Common practice, no published source.
    expect(most).toBeGreaterThan(0);
    expect(most).toBeLessThanOrEqual(20);
  });

  it('answers a refused print with 429, a Retry-After header and the usual error body', async () => {
    const app = express();
    app.get('/busy', () => {
      throw new Busy(5);
    });
    app.use(errorHandler);
    const res = await request(app).get('/busy');
    expect(res.status).toBe(429);
    expect(res.headers['retry-after']).toBe('5');
    expect(res.body.error.code).toBe('rate_limited');
  });

  it('serves a repeated request for an unchanged report from the stored PDF', async () => {
    const url = `/api/sites/${siteIds[0]}/report.pdf`;
    await t.dataSource.query('DELETE FROM report_pdfs');
    const first = await getPdf(url);
    expect(first.status).toBe(200);
    // Chromium stamps each PDF with its creation time to the second: a second print a little
    // later would differ, the stored one is the same bytes.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const again = await getPdf(url);
    expect(again.status).toBe(200);
    expect(binary(first).toString('latin1')).toMatch(/CreationDate/);
    expect(Buffer.compare(binary(again), binary(first))).toBe(0);
    const rows = await t.dataSource.query('SELECT count(*)::int AS n FROM report_pdfs');
    expect(rows[0].n).toBe(1);
  });
});
