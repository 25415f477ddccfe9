// Builders for trial-design API tests: a signed-in network, a complete design and an in-field
// trial with sites.
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';

export interface DesignTestNetwork {
  t: TestApp;
  net: BuiltNetwork;
  other: BuiltNetwork;
  admin: Client;
  coordinator: Client;
  grower: Client;
  grower2: Client;
  member: Client;
  /** The coordinator of the other network. */
  outsider: Client;
}

/** A test app with a fresh network, each of its roles signed in, and a second network's coordinator. */
export async function openDesignNetwork(
  label: string,
  otherLabel: string,
): Promise<DesignTestNetwork> {
  const t = await createTestApp();
  const net = await buildNetwork(t.dataSource, label);
  const other = await buildNetwork(t.dataSource, otherLabel);
  return {
    t,
    net,
    other,
    admin: await signIn(t.app, net.emails.admin),
    coordinator: await signIn(t.app, net.emails.coordinator),
    grower: await signIn(t.app, net.emails.grower),
    grower2: await signIn(t.app, net.emails.grower2),
    member: await signIn(t.app, net.emails.member),
    outsider: await signIn(t.app, other.emails.coordinator),
  };
}

export function completeDesign(overrides: Record<string, unknown> = {}) {
  return {
    name: 'Oat rate test',
    question: 'Does half the usual rate yield as well?',
    crop: 'oats',
    season: '2027',
    referenceRate: 96,
    referenceUnit: 'lb/acre',
    rateLevels: [
      { multiplier: 0.25, label: 'quarter' },
      { multiplier: 0.5, label: 'half' },
      { multiplier: 1, label: 'full' },
      { multiplier: 2, label: 'double' },
    ],
    blocksPerSite: 4,
    rowsPerStrip: 6,
    rowSpacingIn: 8,
    stripLengthFt: 100,
    borderRows: 1,
    thousandKernelWeightG: 32,
    germinationPct: 95,
    emergencePct: 85,
    seedPricePerLb: 0.4,
    grainPricePerBu: 4.5,
    ...overrides,
  };
}

/** Creates a trial with the full design and sends it to the field; returns its id. */
export async function buildActiveTrial(
  coordinator: Client,
  networkId: string,
  overrides: Record<string, unknown> = {},
): Promise<string> {
  const created = await coordinator.post('/api/trials', {
    networkId,
    ...completeDesign(overrides),
  });
  if (created.status !== 201)
    throw new Error(`create trial: ${created.status} ${JSON.stringify(created.body)}`);
  const activated = await coordinator.patch(`/api/trials/${created.body.id}`, {
    status: 'in-field',
  });
  if (activated.status !== 200)
    throw new Error(`activate trial: ${activated.status} ${JSON.stringify(activated.body)}`);
  return created.body.id as string;
}

export async function enrol(
  coordinator: Client,
  trialId: string,
  body: Record<string, unknown>,
): Promise<string> {
  const res = await coordinator.post(`/api/trials/${trialId}/sites`, {
    fieldName: 'North strip field',
    ...body,
  });
  if (res.status !== 201) throw new Error(`enrol: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}
