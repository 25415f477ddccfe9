// SQL only through parameters: every path parameter in the route table and every query-string
// filter the API reads gets injection strings, as the demo coordinator. Nothing may answer 500
// or leak a stack trace, a filter may never widen (an injected OR matches no site), and the
// users table and the demo trial are unchanged afterwards. A static check walks api/ for
// `.query(` calls that splice anything but a vetted constant into SQL text.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RouteEntry } from '../../../api/lib/route-table';
import {
  clientFor,
  createTestApp,
  demoIds,
  signIn,
  type Client,
  type TestApp,
} from '../../helpers/app';

const COORDINATOR = 'coordinator@millbrook.example';

// Source: OWASP Web Security Testing Guide, "Testing for SQL Injection" (WSTG-INPV-05), classic
// tautology, stacked-query and UNION probes; the rest are common practice, no published source.
const INJECTIONS = [
  "' OR '1'='1",
  "'; DROP TABLE users; --",
  '1) UNION SELECT password_hash FROM users --',
  '%27',
  "1' AND pg_sleep(5) IS NULL --",
  '$1',
  '\\',
  'ü🌾 Ωμέγα 漢字 \u202Eevil',
  '\u0000',
  'x'.repeat(5000),
];

// Strings shaped to slip past a loose "looks like a uuid" check: 36 characters of hex and dashes
// that PostgreSQL's uuid type rejects (it would answer 22P02 and the app a 500).
const NEAR_UUIDS = [
  '-'.repeat(36),
  'f'.repeat(36),
  '0123456789abcdef-0123456789abcdef-01',
  '00000000-0000-0000-0000-00000000000g',
];

const PATH_VALUES = [...INJECTIONS, ...NEAR_UUIDS];

/** Query-string parameters the routers read (grep `req.query` in api/): schema → routes. */
const QUERY_PARAMS: Record<string, string[]> = {
  crop: ['pooled'],
  season: ['pooled'],
  soil: ['pooled'],
  previousCrop: ['pooled'],
  sites: ['pooled'],
  seedPrice: ['pooled'],
  grainPrice: ['pooled'],
  stripId: ['photos'],
};

function hasStackTrace(text: string): boolean {
  return /\n\s+at .+\(.+:\d+:\d+\)|node_modules|QueryFailedError|syntax error at or near|invalid input syntax/i.test(
    text,
  );
}

describe('SQL only through parameters', () => {
  let t: TestApp;
  let coordinator: Client;
  let routes: RouteEntry[];
  let ids: {
    memberUserId: string;
    networkId: string;
    trialId: string;
    siteId: string;
    stripId: string;
    photoId: string;
  };
  let before: Record<string, number>;

  async function counts(): Promise<Record<string, number>> {
    const q = async (sql: string, params: unknown[] = []) =>
      Number((await t.dataSource.query(sql, params))[0].n);
    return {
      // Only the demo's own rows: other test files add users and networks in parallel.
      users: await q(`SELECT count(*) AS n FROM users WHERE email LIKE '%@millbrook.example'`),
      memberships: await q('SELECT count(*) AS n FROM memberships WHERE network_id = $1', [
        ids.networkId,
      ]),
      demoSites: await q('SELECT count(*) AS n FROM sites WHERE trial_id = $1', [ids.trialId]),
      demoStrips: await q(
        'SELECT count(*) AS n FROM strips st JOIN sites s ON s.id = st.site_id WHERE s.trial_id = $1',
        [ids.trialId],
      ),
      demoObservations: await q(
        'SELECT count(*) AS n FROM observations o JOIN strips st ON st.id = o.strip_id JOIN sites s ON s.id = st.site_id WHERE s.trial_id = $1',
        [ids.trialId],
      ),
      demoTrialNamed: await q(
        `SELECT count(*) AS n FROM trials WHERE id = $1 AND name = 'Hulless oat seeding rate 2027'`,
        [ids.trialId],
      ),
    };
  }

  beforeAll(async () => {
    t = await createTestApp();
    routes = await t.routes();
    coordinator = await signIn(t.app, COORDINATOR);
    const demo = await demoIds(t.dataSource);
    const [trial] = await t.dataSource.query('SELECT network_id FROM trials WHERE id = $1', [
      demo.oatTrialId,
    ]);
    const siteId = demo.sites[0]!.id;
    const [strip] = await t.dataSource.query(
      'SELECT id FROM strips WHERE site_id = $1 ORDER BY block, position LIMIT 1',
      [siteId],
    );
    const [photo] = await t.dataSource.query('SELECT id FROM attachments LIMIT 1');
    const [member] = await t.dataSource.query(
      `SELECT id FROM users WHERE email = 'member@millbrook.example'`,
    );
    ids = {
      memberUserId: member.id,
      networkId: trial.network_id,
      trialId: demo.oatTrialId,
      siteId,
      stripId: strip.id,
      photoId: photo?.id ?? '00000000-0000-4000-8000-000000000000',
    };
    before = await counts();
  });
  afterAll(() => t.close());

  function fill(route: RouteEntry, override: { name: string; value: string } | null): string {
    return route.path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
      if (override && override.name === name) return encodeURIComponent(override.value);
      switch (name) {
        case 'networkId':
          return ids.networkId;
        case 'trialId':
          return ids.trialId;
        case 'siteId':
          return ids.siteId;
        case 'stripId':
          return ids.stripId;
        case 'photoId':
        case 'attachmentId':
          return ids.photoId;
        case 'userId':
          return ids.memberUserId;
        case 'invitationId':
          return '00000000-0000-4000-8000-000000000000';
        case 'token':
          return 'not-a-real-token-0000000000';
        default:
          throw new Error(`injection test: no value for :${name} in ${route.path}; add one`);
      }
    });
  }

  async function send(route: RouteEntry, url: string) {
    switch (route.method) {
      case 'get':
        return coordinator.get(url);
      case 'post':
        return coordinator.post(url, {});
      case 'patch':
        return coordinator.patch(url, {});
      case 'put':
        return coordinator.put(url, {});
      case 'delete':
        return coordinator.delete(url);
    }
  }

  it('knows every query-string parameter the routers read', () => {
    // A router that starts reading another req.query field must be added to QUERY_PARAMS.
    const readers = walk('api').filter((file) => /req\.query/.test(fs.readFileSync(file, 'utf8')));
    expect(readers.map((f) => path.relative('api', f)).sort()).toEqual([
      'photos/photos.router.ts',
      'reports/reports.router.ts',
    ]);
  });

  it('answers 400 or 404, never 500, to injection strings in every path parameter', async () => {
    const withParams = routes.filter((r) => /:[A-Za-z]+/.test(r.path));
    expect(withParams.length).toBeGreaterThan(20);
    const failures: string[] = [];
    let sent = 0;
    for (const route of withParams) {
      for (const name of [...route.path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!)) {
        for (const value of PATH_VALUES) {
          const url = fill(route, { name, value });
          const res = await send(route, url);
          sent += 1;
          const body = res.text ?? '';
          // :token routes validate their own shape (400 when too short/long) or find nothing (404).
          if (![400, 404].includes(res.status) || hasStackTrace(body)) {
            failures.push(
              `${route.method.toUpperCase()} ${route.path} :${name}=${JSON.stringify(value.slice(0, 40))} → ${res.status} ${body.slice(0, 160)}`,
            );
          }
        }
      }
    }
    expect(sent).toBeGreaterThan(300);
    expect(failures).toEqual([]);
  });

  it('answers 200 or 400 to injection strings in every pooled-report filter, and an injected filter matches no site', async () => {
    const failures: string[] = [];
    const plain = await coordinator.get(`/api/trials/${ids.trialId}/pooled-report`);
    expect(plain.status).toBe(200);
    expect(plain.body.sitesIncluded.length).toBeGreaterThan(1);
    const pooledRoutes = [
      `/api/trials/${ids.trialId}/pooled-report`,
      `/api/public/reports/not-a-real-token-0000000000`,
    ];
    for (const [param, users] of Object.entries(QUERY_PARAMS)) {
      if (!users.includes('pooled')) continue;
      for (const value of INJECTIONS) {
        for (const base of pooledRoutes) {
          const res = await coordinator.get(`${base}?${param}=${encodeURIComponent(value)}`);
          const isPublic = base.includes('/public/');
          const ok = isPublic ? [400, 404] : [200, 400];
          if (!ok.includes(res.status) || hasStackTrace(res.text ?? '')) {
            failures.push(
              `${base}?${param}=${JSON.stringify(value.slice(0, 40))} → ${res.status} ${(res.text ?? '').slice(0, 160)}`,
            );
            continue;
          }
          // A text filter that got through must narrow, not widen: no demo site has these values.
          if (
            !isPublic &&
            res.status === 200 &&
            ['crop', 'season', 'soil', 'previousCrop'].includes(param)
          ) {
            if (res.body.sitesIncluded.length !== 0)
              failures.push(
                `${param}=${JSON.stringify(value.slice(0, 40))} included ${res.body.sitesIncluded.length} sites`,
              );
          }
        }
      }
    }
    // The PDF variant parses the same query first; one probe each is enough (it starts Chromium on success).
    for (const param of ['seedPrice', 'grainPrice', 'sites']) {
      const res = await coordinator.get(
        `/api/trials/${ids.trialId}/pooled-report.pdf?${param}=${encodeURIComponent("' OR '1'='1")}`,
      );
      if (res.status !== 400) failures.push(`pooled-report.pdf?${param} → ${res.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('answers 400 to injection strings in the photo list stripId filter', async () => {
    for (const value of [...INJECTIONS, ...NEAR_UUIDS]) {
      const res = await coordinator.get(
        `/api/sites/${ids.siteId}/photos?stripId=${encodeURIComponent(value)}`,
      );
      expect(res.status, JSON.stringify(value.slice(0, 40))).toBe(400);
      expect(hasStackTrace(res.text)).toBe(false);
    }
  });

  it('answers 400 or 401, never 500, to injection strings in public text fields', async () => {
    const anonymous = clientFor(t.app);
    const failures: string[] = [];
    for (const value of INJECTIONS) {
      const probes: [string, object, number[]][] = [
        ['/api/auth/login', { email: value, password: value }, [400, 401]],
        ['/api/auth/login', { email: `${COORDINATOR}`, password: value }, [400, 401]],
        ['/api/auth/password-reset', { email: value }, [400]],
        [
          '/api/auth/password-reset/complete',
          { token: value, password: 'long-enough-password' },
          [400, 404],
        ],
        [
          '/api/invitations/accept',
          { token: value, name: value, password: 'long-enough-password' },
          [400],
        ],
      ];
      for (const [url, body, ok] of probes) {
        const res = await anonymous.post(url, body);
        if (!ok.includes(res.status) || hasStackTrace(res.text ?? '')) {
          failures.push(
            `POST ${url} ${JSON.stringify(value.slice(0, 40))} → ${res.status} ${(res.text ?? '').slice(0, 160)}`,
          );
        }
      }
    }
    expect(failures).toEqual([]);
    // The coordinator can still sign in: no injected string changed a password.
    await signIn(t.app, COORDINATOR);
  });

  it('leaves the users table and the demo trial as they were', async () => {
    expect(await counts()).toEqual(before);
    const [row] = await t.dataSource.query(`SELECT to_regclass('public.users') AS t`);
    expect(row.t).toBe('users');
  });

  it('builds no SQL text from variables in api/ (template interpolation only of vetted constants)', () => {
    // Each exception: file, the exact `${…}` expression, and why it cannot carry user input.
    // None left: data goes through TypeORM; an exception would be listed here with its reason.
    const ALLOWED: { file: string; expr: string; why: string }[] = [];
    const constants = new Map<string, string>();
    for (const file of walk('api')) {
      for (const m of fs
        .readFileSync(file, 'utf8')
        .matchAll(/(?:export\s+)?const\s+([A-Z][A-Z0-9_]*)\s*=\s*`([^`]*)`/g))
        constants.set(m[1]!, m[2]!);
    }
    const offenders: string[] = [];
    const used = new Set<string>();
    for (const file of walk('api')) {
      const source = fs.readFileSync(file, 'utf8');
      const rel = path.relative('api', file);
      const line = (index: number) => source.slice(0, index).split('\n').length;
      // Concatenated SQL: .query('…' + x) or .query(x + '…').
      for (const m of source.matchAll(
        /(?:\.query|\bpreparedQuery)\s*(?:<[^>]*>)?\(\s*(?:[\w.]+\s*,\s*)?(?:['"`][^'"`]*['"`]\s*\+|[A-Za-z_][\w.]*\s*\+)/g,
      )) {
        offenders.push(`${rel}:${line(m.index!)} concatenates SQL`);
      }
      // Query builder conditions must not be template literals with interpolation either.
      for (const m of source.matchAll(
        /\.(?:where|andWhere|orWhere|having|orderBy|select|addSelect)\(\s*`[^`]*\$\{/g,
      )) {
        offenders.push(`${rel}:${line(m.index!)} interpolates into a query-builder clause`);
      }
      // db.query(`…`) and preparedQuery(db, `…`) (db/prepared.ts).
      for (const m of source.matchAll(
        /(?:\.query|\bpreparedQuery)\s*(?:<[^>]*>)?\(\s*(?:[\w.]+\s*,\s*)?`/g,
      )) {
        for (const expr of interpolations(source, m.index! + m[0].length)) {
          const constant = /^[A-Z][A-Z0-9_]*$/.test(expr) ? constants.get(expr) : undefined;
          if (constant !== undefined && !constant.includes('${')) continue;
          const allowed = ALLOWED.find((a) => a.file === rel && a.expr === expr);
          if (allowed) {
            used.add(`${allowed.file} ${allowed.expr}`);
            continue;
          }
          offenders.push(`${rel}:${line(m.index!)} interpolates \${${expr}} into SQL`);
        }
      }
    }
    expect(offenders).toEqual([]);
    // A stale allow-list entry means the code changed: re-check it rather than keep the exception.
    expect([...used].sort()).toEqual(ALLOWED.map((a) => `${a.file} ${a.expr}`).sort());
  });
});

function walk(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return walk(full);
    return entry.name.endsWith('.ts') ? [full] : [];
  });
}

/** The `${…}` expressions of the template literal whose body starts at `start`. */
function interpolations(source: string, start: number): string[] {
  const found: string[] = [];
  let i = start;
  while (i < source.length) {
    const c = source[i];
    if (c === '\\') {
      i += 2;
      continue;
    }
    if (c === '`') break;
    if (c === '$' && source[i + 1] === '{') {
      let j = i + 2;
      let depth = 1;
      while (depth > 0 && j < source.length) {
        if (source[j] === '{') depth += 1;
        else if (source[j] === '}') depth -= 1;
        j += 1;
      }
      found.push(source.slice(i + 2, j - 1).trim());
      i = j;
      continue;
    }
    i += 1;
  }
  return found;
}
