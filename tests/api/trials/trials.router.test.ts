import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BuiltNetwork, Client, TestApp } from '../../helpers/app';
import { buildActiveTrial, completeDesign, enrol, openDesignNetwork } from './builders';

describe('trial design API', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let coordinator: Client;
  let admin: Client;
  let grower: Client;
  let member: Client;
  let outsider: Client;

  beforeAll(async () => {
    ({ t, net, other, coordinator, admin, grower, member, outsider } = await openDesignNetwork(
      'Trial design',
      'Elsewhere',
    ));
  });
  afterAll(() => t.close());

  describe('POST /api/trials', () => {
    it('creates a draft with the default quarter, half, full and double levels', async () => {
      const res = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Draft only',
      });
      expect(res.status).toBe(201);
      expect(res.body.status).toBe('draft');
      expect(res.body.rateLevels.map((l: { multiplier: number }) => l.multiplier)).toEqual([
        0.25, 0.5, 1, 2,
      ]);
      expect(res.body.rateLevels.map((l: { label: string }) => l.label)).toEqual([
        'quarter',
        'half',
        'full',
        'double',
      ]);
      expect(res.body.canEdit).toBe(true);
    });

    it('lets an admin of the network create a trial', async () => {
      const res = await admin.post('/api/trials', {
        networkId: net.networkId,
        name: 'Admin trial',
      });
      expect(res.status).toBe(201);
    });

    it('answers 400 naming the field when the name is missing', async () => {
      const res = await coordinator.post('/api/trials', { networkId: net.networkId, name: '' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields.name).toMatch(/name the trial/i);
    });

    it('answers 400 naming rateLevels when only one level is given', async () => {
      const res = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'One level',
        rateLevels: [{ multiplier: 1, label: 'full' }],
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.rateLevels).toMatch(/at least 2/i);
    });

    it('answers 400 naming customCrop when a custom crop lacks its values', async () => {
      const res = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Spelt',
        crop: 'custom',
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.customCrop).toBeDefined();
    });

    it('refuses growers and members with 403', async () => {
      for (const client of [grower, member]) {
        const res = await client.post('/api/trials', {
          networkId: net.networkId,
          name: 'Not mine to make',
        });
        expect(res.status).toBe(403);
      }
    });

    it('answers 404 for a network the caller is not in', async () => {
      const res = await outsider.post('/api/trials', {
        networkId: net.networkId,
        name: 'Intruder',
      });
      expect(res.status).toBe(404);
    });

    it('answers 401 when nobody is signed in', async () => {
      const { clientFor } = await import('../../helpers/app');
      const anonymous = clientFor(t.app);
      const res = await anonymous.post('/api/trials', {
        networkId: net.networkId,
        name: 'Anonymous',
      });
      expect(res.status).toBe(401);
    });
  });

  describe('PATCH /api/trials/:trialId', () => {
    it('saves part of a draft without filling in fields that were not sent', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Partial',
        question: 'Keep me',
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, {
        crop: 'barley',
        season: '2028',
      });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        crop: 'barley',
        season: '2028',
        question: 'Keep me',
        status: 'draft',
      });
      expect(res.body.rateLevels).toHaveLength(4);
    });

    it('refuses to activate an incomplete design and names every missing field', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Half done',
        crop: 'wheat',
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, { status: 'in-field' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields)).toEqual(
        expect.arrayContaining([
          'season',
          'referenceRate',
          'referenceUnit',
          'blocksPerSite',
          'thousandKernelWeightG',
        ]),
      );
      const after = await coordinator.get(`/api/trials/${created.body.id}`);
      expect(after.body.status).toBe('draft');
    });

    it('activates a complete design', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        ...completeDesign(),
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, { status: 'in-field' });
      expect(res.status).toBe(200);
      expect(res.body.status).toBe('in-field');
    });

    it('answers 400 naming the field for a row spacing of 0', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Spacing',
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, { rowSpacingIn: 0 });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.rowSpacingIn).toMatch(/above 0/);
    });

    it('answers 400 when two levels share a multiplier', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Duplicate levels',
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, {
        rateLevels: [
          { multiplier: 1, label: 'a' },
          { multiplier: 1, label: 'b' },
        ],
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.rateLevels).toMatch(/different multiplier/);
    });

    it('replaces rate levels while no site is randomized and locks them after', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const three = [
        { multiplier: 0.5, label: 'half' },
        { multiplier: 1, label: 'full' },
        { multiplier: 1.5, label: 'heavy' },
      ];
      const changed = await coordinator.patch(`/api/trials/${trialId}`, { rateLevels: three });
      expect(changed.status).toBe(200);
      expect(changed.body.rateLevels.map((l: { label: string }) => l.label)).toEqual([
        'half',
        'full',
        'heavy',
      ]);
      const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
      expect((await coordinator.post(`/api/sites/${siteId}/randomize`, {})).status).toBe(200);
      const locked = await coordinator.patch(`/api/trials/${trialId}`, {
        rateLevels: three.slice(0, 2),
      });
      expect(locked.status).toBe(409);
      expect(locked.body.error.message).toMatch(/randomized/);
      const blocks = await coordinator.patch(`/api/trials/${trialId}`, { blocksPerSite: 6 });
      expect(blocks.status).toBe(409);
      const detail = await coordinator.get(`/api/trials/${trialId}`);
      expect(detail.body.designLocked).toBe(true);
    });

    it('refuses growers and members with 403 and outsiders with 404', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      expect((await grower.patch(`/api/trials/${trialId}`, { name: 'Mine now' })).status).toBe(403);
      expect((await member.patch(`/api/trials/${trialId}`, { name: 'Mine now' })).status).toBe(403);
      expect((await outsider.patch(`/api/trials/${trialId}`, { name: 'Mine now' })).status).toBe(
        404,
      );
    });

    it('refuses a draft-to-closed jump with 409', async () => {
      const created = await coordinator.post('/api/trials', {
        networkId: net.networkId,
        name: 'Straight to closed',
      });
      const res = await coordinator.patch(`/api/trials/${created.body.id}`, { status: 'closed' });
      expect(res.status).toBe(409);
    });
  });

  describe('GET /api/trials/:trialId', () => {
    it('shows a grower only their own sites', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      await enrol(coordinator, trialId, { growerUserId: net.userIds.grower, fieldName: 'Mine' });
      await enrol(coordinator, trialId, { growerUserId: net.userIds.grower2, fieldName: 'Theirs' });
      const asGrower = await grower.get(`/api/trials/${trialId}`);
      expect(asGrower.status).toBe(200);
      expect(asGrower.body.canEdit).toBe(false);
      expect(asGrower.body.sites.map((s: { fieldName: string }) => s.fieldName)).toEqual(['Mine']);
      const asCoordinator = await coordinator.get(`/api/trials/${trialId}`);
      expect(asCoordinator.body.sites).toHaveLength(2);
      expect(asCoordinator.body.siteCount).toBe(2);
    });

    it('answers 403 to a member while nothing is published and 404 to an outsider', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      expect((await member.get(`/api/trials/${trialId}`)).status).toBe(403);
      expect((await outsider.get(`/api/trials/${trialId}`)).status).toBe(404);
    });

    it('answers 404 for an unknown trial', async () => {
      const res = await coordinator.get('/api/trials/00000000-0000-4000-8000-000000000000');
      expect(res.status).toBe(404);
    });
  });

  describe('POST /api/trials/:trialId/sites', () => {
    it('enrols an existing member as the grower', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
        growerUserId: net.userIds.grower,
        fieldName: 'Creek field',
        soil: 'silt loam',
        previousCrop: 'clover',
        fertility: 'compost',
        notes: 'wet corner',
      });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        fieldName: 'Creek field',
        soil: 'silt loam',
        previousCrop: 'clover',
        randomized: false,
      });
      expect(res.body.grower).toMatchObject({
        userId: net.userIds.grower,
        email: net.emails.grower,
        invitationPending: false,
      });
      expect(res.body.invitation).toBeNull();
    });

    it('links a site to an existing member found by e-mail without inviting', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
        growerEmail: net.emails.grower2,
        fieldName: 'By address',
      });
      expect(res.status).toBe(201);
      expect(res.body.grower.userId).toBe(net.userIds.grower2);
    });

    it('invites a new address by e-mail with text and HTML parts and a link on PUBLIC_URL', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId, { name: 'Invite trial' });
      const email = `new-grower-${net.suffix}@test.example`;
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
        growerEmail: email,
        fieldName: 'Back forty',
      });
      expect(res.status).toBe(201);
      expect(res.body.grower).toMatchObject({ userId: null, email, invitationPending: true });
      const mail = await t.mailCatcher.waitFor((m) => m.to.includes(email));
      expect(mail.subject).toContain('Invite trial');
      expect(mail.text).toMatch(/http:\/\/sheaf\.test\/invite\/[A-Za-z0-9_-]+/);
      expect(mail.html).toContain('http://sheaf.test/invite/');
    });

    it('answers 400 naming growerEmail when no grower is given', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, { fieldName: 'Nobody' });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.growerEmail).toMatch(/grower/i);
    });

    it('answers 400 naming fieldName when the field has no name', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
        growerUserId: net.userIds.grower,
        fieldName: ' ',
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.fieldName).toBeDefined();
    });

    it('answers 400 for a grower from another network', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
        growerUserId: other.userIds.grower,
        fieldName: 'Foreign',
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.growerUserId).toBeDefined();
    });

    it('refuses growers with 403', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await grower.post(`/api/trials/${trialId}/sites`, {
        growerUserId: net.userIds.grower,
        fieldName: 'Self-enrolled',
      });
      expect(res.status).toBe(403);
    });
  });

  describe('GET /api/trials/:trialId/people', () => {
    it('lists the network’s people for the enrol form, growers first, to coordinators only', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      const res = await coordinator.get(`/api/trials/${trialId}/people`);
      expect(res.status).toBe(200);
      expect(res.body).toHaveLength(5);
      expect(res.body.slice(0, 2).map((p: { role: string }) => p.role)).toEqual([
        'grower',
        'grower',
      ]);
      expect((await grower.get(`/api/trials/${trialId}/people`)).status).toBe(403);
    });
  });

  describe('POST /api/trials/:trialId/packets/send', () => {
    it('e-mails every randomized site and lists the ones it skipped', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId, { name: 'Packet trial' });
      const ready = await enrol(coordinator, trialId, {
        growerUserId: net.userIds.grower,
        fieldName: 'Ready field',
      });
      const waiting = await enrol(coordinator, trialId, {
        growerUserId: net.userIds.grower2,
        fieldName: 'Waiting field',
      });
      await coordinator.post(`/api/sites/${ready}/randomize`, {});
      const res = await coordinator.post(`/api/trials/${trialId}/packets/send`);
      expect(res.status).toBe(200);
      expect(res.body.sent).toEqual([{ siteId: ready, to: net.emails.grower }]);
      expect(res.body.skipped).toEqual([
        { siteId: waiting, reason: expect.stringMatching(/not randomized/i) },
      ]);
      const mail = await t.mailCatcher.waitFor(
        (m) => m.to.includes(net.emails.grower) && m.subject.includes('Ready field'),
      );
      expect(mail.text).toContain(`http://sheaf.test/sites/${ready}/packet`);
      expect(mail.html).toContain(`http://sheaf.test/sites/${ready}/packet`);
    });

    it('refuses growers with 403', async () => {
      const trialId = await buildActiveTrial(coordinator, net.networkId);
      expect((await grower.post(`/api/trials/${trialId}/packets/send`)).status).toBe(403);
    });
  });
});
