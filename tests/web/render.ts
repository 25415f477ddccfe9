// Component-test helpers: render a component with a fresh query client and an in-memory router
// (happy-dom supplies the DOM; each test file opts in with a vitest-environment comment).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createElement, type ReactElement } from 'react';
import { MemoryRouter } from 'react-router-dom';
import type { SessionUser } from '../../shared/schemas/auth';
import type { TrialDetail } from '../../shared/schemas/trial';

export function renderWithProviders(element: ReactElement) {
  const client = new QueryClient({
    defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
  });
  const user = userEvent.setup();
  const view = render(
    createElement(QueryClientProvider, { client }, createElement(MemoryRouter, null, element)),
  );
  return { ...view, user, client };
}

const NETWORK = '11111111-1111-4111-8111-111111111111';

export function buildCoordinator(): SessionUser {
  return {
    id: '22222222-2222-4222-8222-222222222222',
    email: 'coordinator@example.test',
    name: 'Invented Coordinator',
    memberships: [{ networkId: NETWORK, networkName: 'Invented Network', role: 'coordinator' }],
  };
}

export function buildTrial(overrides: Partial<TrialDetail> = {}): TrialDetail {
  const level = (n: number, multiplier: number, label: string) => ({
    id: `33333333-3333-4333-8333-33333333333${n}`,
    multiplier,
    label,
  });
  return {
    id: '44444444-4444-4444-8444-444444444444',
    networkId: NETWORK,
    networkName: 'Invented Network',
    name: 'Invented oat trial',
    question: '',
    status: 'draft',
    crop: 'oats',
    customCrop: null,
    season: '2027',
    unitSystem: 'imperial',
    referenceRate: 96,
    referenceUnit: 'lb/acre',
    rateLevels: [level(1, 0.5, 'half'), level(2, 1, 'full')],
    blocksPerSite: 4,
    rowsPerStrip: 6,
    rowSpacingIn: 8,
    stripLengthFt: 100,
    borderRows: 1,
    thousandKernelWeightG: 32,
    germinationPct: 95,
    emergencePct: 85,
    seedPricePerLb: 0.9,
    grainPricePerBu: 4,
    siteCount: 0,
    pooledPublishedAt: null,
    publicLinkToken: null,
    createdAt: '2026-12-01T00:00:00.000Z',
    updatedAt: '2026-12-01T00:00:00.000Z',
    sites: [],
    viewerRole: 'coordinator',
    canEdit: true,
    designLocked: false,
    sowingStarted: false,
    lockedFields: [],
    harvest: { sites: 0, withYield: 0, lost: 0 },
    closedAt: null,
    canDelete: false,
    ...overrides,
  };
}

/** A fetch that fails the test if any request is made (validation must stop before the API). */
export function refuseFetch(): { calls: string[] } {
  const calls: string[] = [];
  globalThis.fetch = (async (input: RequestInfo | URL) => {
    calls.push(String(input));
    throw new Error(`unexpected request ${String(input)}`);
  }) as typeof fetch;
  return { calls };
}
