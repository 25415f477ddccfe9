import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rateTable } from '../../../shared/design/rate-table';
import type { BuiltNetwork, Client, TestApp } from '../../helpers/app';
import { buildActiveTrial, completeDesign, enrol, openDesignNetwork } from '../trials/builders';

interface LayoutBody {
  seed: string;
  blocks: {
    block: number;
    strips: {
      stripId: string;
      position: number;
      plotNumber: number;
      rate: number;
      label: string;
      seedGrams: number;
    }[];
  }[];
}

const orders = (layout: LayoutBody) =>
  layout.blocks.map((b) => b.strips.map((s) => s.label).join(','));

describe('site design API', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let coordinator: Client;
  let grower: Client;
  let grower2: Client;
  let member: Client;
  let outsider: Client;
  let trialId: string;

  beforeAll(async () => {
    ({ t, net, coordinator, grower, grower2, member, outsider } = await openDesignNetwork(
      'Site design',
      'Far away',
    ));
    trialId = await buildActiveTrial(coordinator, net.networkId, { name: 'Site tests' });
  });
  afterAll(() => t.close());

  describe('GET /api/sites/:siteId', () => {
    it('gives the grower the site with its trial design, dates and flags', async () => {
      const siteId = await enrol(coordinator, trialId, {
        growerUserId: net.userIds.grower,
        fieldName: 'Detail field',
      });
      const res = await grower.get(`/api/sites/${siteId}`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        id: siteId,
        trialId,
        fieldName: 'Detail field',
        randomized: false,
        sowingDate: null,
        publishedAt: null,
        calibrations: [],
        isGrower: true,
        canCoordinate: false,
      });
      expect(res.body.trial).toMatchObject({
        name: 'Site tests',
        crop: 'oats',
        blocksPerSite: 4,
        rowSpacingIn: 8,
      });
      expect(res.body.trial.rateLevels).toHaveLength(4);
    });

    it('answers 403 to another grower and to a member, 404 to an outsider', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await grower2.get(`/api/sites/${siteId}`)).status).toBe(403);
      expect((await member.get(`/api/sites/${siteId}`)).status).toBe(403);
      expect((await outsider.get(`/api/sites/${siteId}`)).status).toBe(404);
    });
  });

  describe('POST /api/sites/:siteId/randomize', () => {
    it('puts every rate once in every block and stores the seed', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const res = await coordinator.post(`/api/sites/${siteId}/randomize`, {
        seed: 'fixed-seed-1',
      });
      expect(res.status).toBe(200);
      const layout = res.body as LayoutBody;
      expect(layout.seed).toBe('fixed-seed-1');
      expect(layout.blocks.map((b) => b.block)).toEqual([1, 2, 3, 4]);
      for (const block of layout.blocks) {
        expect(block.strips.map((s) => s.position)).toEqual([1, 2, 3, 4]);
        expect(block.strips.map((s) => s.rate).sort((a, b) => a - b)).toEqual([0.25, 0.5, 1, 2]);
      }
      expect(new Set(orders(layout)).size).toBe(4);
      // Common practice, no published source: plots numbered block × 100 + position.
      expect(layout.blocks.flatMap((b) => b.strips.map((s) => s.plotNumber))).toEqual([
        101, 102, 103, 104, 201, 202, 203, 204, 301, 302, 303, 304, 401, 402, 403, 404,
      ]);
      const detail = await coordinator.get(`/api/sites/${siteId}`);
      expect(detail.body).toMatchObject({
        randomized: true,
        randomizationSeed: 'fixed-seed-1',
        stripCount: 16,
      });
    });

    it('gives the same map for the same seed on another site', async () => {
      const a = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const b = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower2 });
      const first = (await coordinator.post(`/api/sites/${a}/randomize`, { seed: 'same-seed' }))
        .body as LayoutBody;
      const second = (await coordinator.post(`/api/sites/${b}/randomize`, { seed: 'same-seed' }))
        .body as LayoutBody;
      expect(orders(second)).toEqual(orders(first));
      const third = (await coordinator.post(`/api/sites/${b}/randomize`, { seed: 'another-seed' }))
        .body as LayoutBody;
      expect(orders(third)).not.toEqual(orders(first));
    });

    it('replaces the strips when re-randomized before sowing', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const first = (await coordinator.post(`/api/sites/${siteId}/randomize`, {}))
        .body as LayoutBody;
      const second = (await coordinator.post(`/api/sites/${siteId}/randomize`, {}))
        .body as LayoutBody;
      expect(second.seed).not.toBe(first.seed);
      const firstIds = new Set(first.blocks.flatMap((b) => b.strips.map((s) => s.stripId)));
      expect(
        second.blocks.flatMap((b) => b.strips.map((s) => s.stripId)).some((id) => firstIds.has(id)),
      ).toBe(false);
      const [{ n }] = await t.dataSource.query(
        'SELECT count(*)::int AS n FROM strips WHERE site_id = $1',
        [siteId],
      );
      expect(n).toBe(16);
    });

    it('refuses with 409 once a sowing date is recorded', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      await coordinator.post(`/api/sites/${siteId}/randomize`, { seed: 'before-sowing' });
      await t.dataSource.query(`UPDATE sites SET sowing_date = '2027-04-20' WHERE id = $1`, [
        siteId,
      ]);
      const res = await coordinator.post(`/api/sites/${siteId}/randomize`, {
        seed: 'after-sowing',
      });
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/sowing is already recorded/i);
      const layout = (await coordinator.get(`/api/sites/${siteId}/layout`)).body as LayoutBody;
      expect(layout.seed).toBe('before-sowing');
    });

    it('refuses with 409 once a strip has data', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const layout = (await coordinator.post(`/api/sites/${siteId}/randomize`, {}))
        .body as LayoutBody;
      await t.dataSource.query(
        'INSERT INTO observations (strip_id, stand_counts) VALUES ($1, $2)',
        [layout.blocks[0]!.strips[0]!.stripId, JSON.stringify([31, 29])],
      );
      const res = await coordinator.post(`/api/sites/${siteId}/randomize`, {});
      expect(res.status).toBe(409);
    });

    it('refuses with 409 while the trial is a draft', async () => {
      const draft = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        ...completeDesign({ name: 'Still a draft' }),
      });
      const siteId = await enrol(coordinator, draft.body.id, { growerUserId: net.userIds.grower });
      const res = await coordinator.post(`/api/sites/${siteId}/randomize`, {});
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/finish the trial design/i);
    });

    it('answers 400 naming seed for an over-long seed', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const res = await coordinator.post(`/api/sites/${siteId}/randomize`, {
        seed: 'x'.repeat(65),
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.seed).toBeDefined();
    });

    it('refuses the grower with 403', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await grower.post(`/api/sites/${siteId}/randomize`, {})).status).toBe(403);
    });
  });

  describe('GET /api/sites/:siteId/layout', () => {
    it('gives grams of seed per strip from the design', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      await coordinator.post(`/api/sites/${siteId}/randomize`, { seed: 'grams' });
      const res = await grower.get(`/api/sites/${siteId}/layout`);
      expect(res.status).toBe(200);
      const design = completeDesign();
      const expected = new Map(rateTable(design).map((r) => [r.multiplier, r.gramsPerStrip]));
      for (const strip of (res.body as LayoutBody).blocks.flatMap((b) => b.strips)) {
        expect(strip.seedGrams).toBeCloseTo(expected.get(strip.rate)!, 1);
        expect(strip.seedGrams).toBeGreaterThan(0);
      }
      // 96 lb/acre × 6 rows × 8 in × 100 ft: 96 × 453.59 g × 400 ft² ÷ 43,560 ft² = 399.9 g (derived).
      const full = (res.body as LayoutBody).blocks[0]!.strips.find((s) => s.rate === 1)!;
      expect(full.seedGrams).toBeCloseTo(399.9, 0);
    });

    it('answers 403 to a member', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await member.get(`/api/sites/${siteId}/layout`)).status).toBe(403);
    });
  });

  describe('POST /api/sites/:siteId/calibrations', () => {
    const run = {
      wheelCircumferenceFt: 3,
      turns: 1,
      seedsCounted: 80,
      targetSeedsPerFt: 10,
      rowSpacingIn: 8,
      rateLabel: 'full',
    };

    it('stores the grower’s calibration with the percent of target', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const res = await grower.post(`/api/sites/${siteId}/calibrations`, run);
      expect(res.status).toBe(201);
      // 80 seeds counted against a target of 30 per 3-ft turn = 267 % (common practice, no published source).
      expect(res.body.calibrations).toHaveLength(1);
      expect(res.body.calibrations[0]).toMatchObject({
        seedsCounted: 80,
        deliveredSeedsPerFt: 26.67,
        percentOfTarget: 266.7,
        rateLabel: 'full',
      });
      const detail = await grower.get(`/api/sites/${siteId}`);
      expect(detail.body.calibrations).toHaveLength(1);
    });

    it('lets the coordinator store one too', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await coordinator.post(`/api/sites/${siteId}/calibrations`, run)).status).toBe(201);
    });

    it('answers 400 naming turns for zero turns', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const res = await grower.post(`/api/sites/${siteId}/calibrations`, { ...run, turns: 0 });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.turns).toMatch(/at least 1/i);
    });

    it('refuses another grower with 403 and a member with 403', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await grower2.post(`/api/sites/${siteId}/calibrations`, run)).status).toBe(403);
      expect((await member.post(`/api/sites/${siteId}/calibrations`, run)).status).toBe(403);
    });
  });

  describe('POST /api/sites/:siteId/packet/send', () => {
    it('e-mails the grower a link to the packet on PUBLIC_URL, in text and HTML', async () => {
      const siteId = await enrol(coordinator, trialId, {
        growerUserId: net.userIds.grower2,
        fieldName: 'Packet field',
      });
      await coordinator.post(`/api/sites/${siteId}/randomize`, {});
      const res = await coordinator.post(`/api/sites/${siteId}/packet/send`);
      expect(res.status).toBe(200);
      expect(res.body.sent).toEqual([{ siteId, to: net.emails.grower2 }]);
      const mail = await t.mailCatcher.waitFor(
        (m) => m.to.includes(net.emails.grower2) && m.subject.includes('Packet field'),
      );
      expect(mail.subject).toMatch(/field packet is ready/i);
      expect(mail.text).toContain(`http://sheaf.test/sites/${siteId}/packet`);
      expect(mail.html).toContain(`href="http://sheaf.test/sites/${siteId}/packet"`);
    });

    it('answers 409 before the site is randomized', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      const res = await coordinator.post(`/api/sites/${siteId}/packet/send`);
      expect(res.status).toBe(409);
    });

    it('refuses the grower with 403', async () => {
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await grower.post(`/api/sites/${siteId}/packet/send`)).status).toBe(403);
    });
  });
});
