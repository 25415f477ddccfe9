// The test run fails when the API server prints pg's warning about overlapping queries on one
// connection (tests/setup/global-server.ts). This shows the check recognises pg's real warning,
// and that a burst of parallel writes and reads against a two-worker server prints none.
import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { OVERLAPPING_QUERY_WARNING, freePort, startApiServer } from '../../helpers/spawn-server';
import { signIn, testDatabaseUrl, type TestApp } from '../../helpers/app';
import { openCollectSite, type CollectSite } from '../strips/collect-builders';
import type { BuiltNetwork } from '../../helpers/app';

describe('overlapping queries on one connection', () => {
  it("recognises pg's own warning when two queries overlap on one client", () => {
    const script = `
      const pg = require('pg');
      const client = new pg.Client(${JSON.stringify(testDatabaseUrl())});
      client.connect().then(() => Promise.all([1, 2, 3].map((n) => client.query('SELECT ' + n))))
        .then(() => client.end());`;
    const run = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8' });
    expect(run.status).toBe(0);
    expect(run.stderr).toMatch(OVERLAPPING_QUERY_WARNING);
  });

  describe('under a burst of parallel requests', () => {
    let t: TestApp;
    let net: BuiltNetwork;
    let site: CollectSite;
    let server: Awaited<ReturnType<typeof startApiServer>>;
    let base: string;
    beforeAll(async () => {
      ({ t, net, site } = await openCollectSite('Overlap burst'));
      const port = await freePort();
      base = `http://127.0.0.1:${port}`;
      server = await startApiServer({ ...t.serverEnv, PORT: String(port) });
    });
    afterAll(async () => {
      await server?.stop();
      await t.close();
    });

    it('prints no overlapping-query warning', async () => {
      const grower = await signIn(base, net.emails.grower);
      const coordinator = await signIn(base, net.emails.coordinator);
      const reads = Array.from({ length: 20 }, (_, i) =>
        (i % 2 ? grower : coordinator).get(`/api/sites/${site.siteId}/report`),
      );
      const writes = site.strips
        .slice(0, 8)
        .map((strip, i) =>
          grower.patch(`/api/strips/${strip.id}`, { version: 1, values: { notes: `burst ${i}` } }),
        );
      const results = await Promise.all([...reads, ...writes]);
      expect(results.every((r) => r.status < 500)).toBe(true);
      expect((await coordinator.post(`/api/sites/${site.siteId}/publish`)).status).toBeLessThan(
        500,
      );
      expect(server.output()).not.toMatch(OVERLAPPING_QUERY_WARNING);
    });
  });
});
