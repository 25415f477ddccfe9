// Walks every route in the router table with every role and checks the status its declared
// policy promises. A route added without a policy, or with a policy this matrix does not
// know, fails here.
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RouteEntry } from '../../../api/lib/route-table';
import type { PolicyKind } from '../../../api/middleware/access';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';

type Persona =
  'anonymous' | 'member' | 'otherGrower' | 'otherCoordinator' | 'grower' | 'coordinator' | 'admin';
const PERSONAS: Persona[] = [
  'anonymous',
  'member',
  'otherGrower',
  'otherCoordinator',
  'grower',
  'coordinator',
  'admin',
];

/** 'allowed' means the policy let the request through (any status but 401/403) and nothing broke (no 5xx). */
type Expectation = 401 | 403 | 404 | 'allowed';
const MATRIX: Record<PolicyKind, Record<Persona, Expectation>> = {
  public: {
    anonymous: 'allowed',
    member: 'allowed',
    otherGrower: 'allowed',
    otherCoordinator: 'allowed',
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'signed-in': {
    anonymous: 401,
    member: 'allowed',
    otherGrower: 'allowed',
    otherCoordinator: 'allowed',
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  admin: {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 403,
    grower: 403,
    coordinator: 403,
    admin: 'allowed',
  },
  'network-coordinator': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 403,
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'trial-coordinator': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 403,
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'trial-reader': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'pooled-reader': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 403,
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'site-coordinator': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 403,
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'site-grower': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'site-reader': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'strip-grower': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'attachment-reader': {
    anonymous: 401,
    member: 403,
    otherGrower: 403,
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
  'series-reader': {
    anonymous: 401,
    member: 'allowed',
    otherGrower: 'allowed',
    otherCoordinator: 404,
    grower: 'allowed',
    coordinator: 'allowed',
    admin: 'allowed',
  },
};

interface Fixture {
  networkId: string;
  trialId: string;
  siteId: string;
  stripId: string;
  photoId: string;
  memberUserId: string;
  invitationId: string;
  seriesId: string;
}

/** A fresh unpublished trial with one randomized site (owned by the grower), strips, a photo record and an open invitation. */
async function buildFixture(t: TestApp, net: BuiltNetwork): Promise<Fixture> {
  const q = (sql: string, params: unknown[]) => t.dataSource.query(sql, params);
  const [trial] = await q(
    `INSERT INTO trials (network_id, name, status, crop, season, reference_rate, reference_unit, blocks_per_site, rows_per_strip,
       row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu)
     VALUES ($1, 'Matrix trial', 'in-field', 'oats', '2027', 90, 'lb/acre', 2, 4, 8, 50, 1, 32, 90, 85, 0.5, 4) RETURNING id`,
    [net.networkId],
  );
  const levels: string[] = [];
  for (const [i, m] of [0.5, 1].entries()) {
    const [level] = await q(
      'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4) RETURNING id',
      [trial.id, i + 1, m, m === 1 ? 'full' : 'half'],
    );
    levels.push(level.id);
  }
  const [site] = await q(
    `INSERT INTO sites (trial_id, grower_user_id, field_name, randomization_seed, randomized_at) VALUES ($1, $2, 'Matrix field', 'm', now()) RETURNING id`,
    [trial.id, net.userIds.grower],
  );
  let stripId = '';
  for (const block of [1, 2]) {
    for (const [p, levelId] of levels.entries()) {
      const [strip] = await q(
        'INSERT INTO strips (site_id, block, position, rate_level_id) VALUES ($1, $2, $3, $4) RETURNING id',
        [site.id, block, p + 1, levelId],
      );
      stripId ||= strip.id;
    }
  }
  const [photo] = await q(
    `INSERT INTO attachments (site_id, strip_id, stored_name, original_name, mime_type, size_bytes) VALUES ($1, $2, $3, 'x.png', 'image/png', 1) RETURNING id`,
    [site.id, stripId, `matrix-${crypto.randomUUID()}.png`],
  );
  const [invitation] = await q(
    `INSERT INTO invitations (network_id, email, role, token_hash, invited_by, expires_at)
     VALUES ($1, $2, 'member', $3, $4, now() + interval '14 days') RETURNING id`,
    [
      net.networkId,
      `matrix-invite-${crypto.randomUUID()}@test.example`,
      crypto.randomUUID(),
      net.userIds.coordinator,
    ],
  );
  // A person of their own for :userId, so removing them (DELETE …/members/:userId) leaves the
  // personas' memberships alone.
  const [person] = await q(
    `INSERT INTO users (email, name, password_hash) VALUES ($1, 'Matrix person', 'x') RETURNING id`,
    [`matrix-person-${crypto.randomUUID()}@test.example`],
  );
  await q(`INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'member')`, [
    person.id,
    net.networkId,
  ]);
  const [series] = await q(
    `INSERT INTO trial_series (network_id, name, crop) VALUES ($1, 'Matrix series', 'oats') RETURNING id`,
    [net.networkId],
  );
  return {
    seriesId: series.id,
    networkId: net.networkId,
    trialId: trial.id,
    siteId: site.id,
    stripId,
    photoId: photo.id,
    memberUserId: person.id,
    invitationId: invitation.id,
  };
}

function concretePath(route: RouteEntry, fixture: Fixture): string {
  return route.path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
    switch (name) {
      case 'networkId':
        return fixture.networkId;
      case 'trialId':
        return fixture.trialId;
      case 'siteId':
        return fixture.siteId;
      case 'stripId':
        return fixture.stripId;
      case 'photoId':
      case 'attachmentId':
        return fixture.photoId;
      case 'userId':
        return fixture.memberUserId;
      case 'invitationId':
        return fixture.invitationId;
      case 'seriesId':
        return fixture.seriesId;
      case 'token':
        return 'not-a-real-token-for-the-matrix';
      default:
        throw new Error(`route-matrix: no fixture value for :${name} in ${route.path}; add one`);
    }
  });
}

async function call(client: Client, route: RouteEntry, url: string) {
  switch (route.method) {
    case 'get':
      return client.get(url);
    case 'post':
      return client.post(url, {});
    case 'patch':
      return client.patch(url, {});
    case 'put':
      return client.put(url, {});
    case 'delete':
      return client.delete(url);
  }
}

describe('every API route declares a policy and enforces it for every role', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  const clients = {} as Record<Persona, Client>;
  let routes: RouteEntry[];

  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Matrix');
    other = await buildNetwork(t.dataSource, 'Matrix other');
    routes = await t.routes();
    clients.anonymous = clientFor(t.app);
    clients.member = await signIn(t.app, net.emails.member);
    clients.otherGrower = await signIn(t.app, net.emails.grower2);
    clients.otherCoordinator = await signIn(t.app, other.emails.coordinator);
    clients.grower = await signIn(t.app, net.emails.grower);
    clients.coordinator = await signIn(t.app, net.emails.coordinator);
    clients.admin = await signIn(t.app, net.emails.admin);
  });
  afterAll(() => t.close());

  it('registers routes only through the policy-checking router', () => {
    const offenders: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (full.endsWith('.ts') && !full.endsWith('route-table.ts')) {
          const text = fs.readFileSync(full, 'utf8');
          if (
            /\b(router|app)\.(get|post|patch|put|delete|all)\(\s*['"`]\/api/.test(text) ||
            /\brouter\.(get|post|patch|put|delete|all)\(/.test(text)
          )
            offenders.push(full);
        }
      }
    };
    walk('api');
    expect(offenders).toEqual([]);
  });

  it('knows the policy of every route in the table', () => {
    expect(routes.length).toBeGreaterThan(10);
    for (const route of routes)
      expect(Object.keys(MATRIX), `${route.method} ${route.path}`).toContain(route.policy.kind);
  });

  it('answers each role as the route policy says', async () => {
    const failures: string[] = [];
    for (const route of routes) {
      // Logging out would end the persona's session for the rest of the walk.
      if (route.path === '/api/auth/logout') continue;
      const fixture = await buildFixture(t, net);
      const url = concretePath(route, fixture);
      for (const persona of PERSONAS) {
        const expected = MATRIX[route.policy.kind][persona];
        const res = await call(clients[persona], route, url);
        const ok =
          expected === 'allowed'
            ? ![401, 403].includes(res.status) &&
              res.status < 500 &&
              res.body?.error?.code !== 'csrf_invalid'
            : res.status === expected;
        if (!ok)
          failures.push(
            `${route.method.toUpperCase()} ${route.path} as ${persona}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body).slice(0, 120)}`,
          );
      }
    }
    expect(failures).toEqual([]);
  }, 180_000);
});
