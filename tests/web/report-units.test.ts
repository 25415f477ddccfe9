// @vitest-environment happy-dom
// Report parts on a metric trial: counts per m², amended lengths in cm and m, and prices typed
// per kg and per tonne but sent to the API per lb and per bushel.
import { cleanup, screen } from '@testing-library/react';
import { createElement } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import type { ComponentRow, PooledQuery, PooledReport } from '../../shared/schemas/report';
import { decimalsFor } from '../../shared/reports/format-numbers';
import { designUnits } from '../../shared/units/design-units';
import { AmendmentsNotice } from '../../web/features/reports/components/amendments-notice';
import { FiltersForm } from '../../web/features/reports/components/pooled-report-controls';
import { ComponentsTable } from '../../web/features/reports/components/report-tables';
import { ResponseModelsSection } from '../../web/features/reports/components/response-models-section';
import type { ResponseModels } from '../../shared/analysis/index';
import { refuseFetch, renderWithProviders } from './render';

afterEach(cleanup);

const METRIC_UNITS = {
  yield: 't/ha',
  seed: 'kg/ha',
  money: '$/ha',
  system: 'metric' as const,
  bushelPounds: 60,
};

describe('ComponentsTable on a metric trial', () => {
  it('shows plants and heads per m² and yield in t/ha with two decimals', () => {
    const row: ComponentRow = {
      rate: '1',
      label: 'full',
      strips: 4,
      seedRate: 134.5,
      plantsPerSquareFoot: 20,
      establishmentPercent: 80,
      tillersPerPlant: 2.1,
      headsPerSquareFoot: 50,
      headsPerPlant: 2.5,
      yield: 4.0353,
      seedReturn: 30,
      returnOverSeedCost: 900,
    };
    renderWithProviders(
      createElement(ComponentsTable, {
        rows: [row],
        seedUnit: 'kg/ha',
        yieldUnit: 't/ha',
        moneyUnit: '$/ha',
        perArea: designUnits('metric').perArea,
        digits: decimalsFor(4.0353),
      }),
    );
    expect(screen.getByText('Plants/m²')).toBeTruthy();
    expect(screen.queryByText('Plants/ft²')).toBeNull();
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft² = 0.092 903 04 m²; 20/ft² = 215/m² and
    // 50/ft² = 538/m².
    expect(screen.getByText('215')).toBeTruthy();
    expect(screen.getByText('538')).toBeTruthy();
    // Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg; 4,035.3 kg/ha = 4.04 t/ha.
    expect(screen.getByText('Yield (t/ha)')).toBeTruthy();
    expect(screen.getByText('4.04')).toBeTruthy();
  });
});

describe('AmendmentsNotice on a metric trial', () => {
  it('shows an amended row spacing in cm and strip length in m', async () => {
    refuseFetch();
    const { client } = renderWithProviders(
      createElement(AmendmentsNotice, { trialId: 't1', system: 'metric' }),
    );
    client.setQueryData(
      ['trials', 'amendments', 't1'],
      [
        {
          id: '55555555-5555-4555-8555-555555555555',
          at: '2027-04-20T15:00:00Z',
          byName: 'Invented Coordinator',
          reason: 'The drill was set wider',
          changes: [
            { field: 'rowSpacingIn', from: 7.5, to: 10 },
            { field: 'stripLengthFt', from: 100, to: 50 },
          ],
          reissuedSites: 1,
        },
      ],
    );
    const list = await screen.findByTestId('amendments');
    // Source: NIST SP 811 (2008), Appendix B.8: 1 in = 2.54 cm and 1 ft = 0.3048 m exactly.
    expect(list.textContent).toContain('row spacing (cm) 19.1 → 25.4');
    expect(list.textContent).toContain('strip length (m) 30.5 → 15.2');
    expect(list.textContent).not.toMatch(/\(in\)|\(ft\)/);
  });
});

describe('Pooled report prices on a metric trial', () => {
  it('shows $/kg and $/t and sends the API $/lb and $/bu', async () => {
    refuseFetch();
    const report = {
      trial: { crop: 'wheat', units: METRIC_UNITS },
      prices: { seedPricePerLb: 0.5, grainPricePerBu: 8 },
      filterOptions: { soil: [], previousCrop: [] },
      canPublish: false,
    } as unknown as PooledReport;
    const queries: PooledQuery[] = [];
    const { user } = renderWithProviders(
      createElement(FiltersForm, { report, query: {}, onQuery: (q) => queries.push(q) }),
    );
    const seed = screen.getByLabelText('Seed price') as HTMLInputElement;
    const grain = screen.getByLabelText('Grain price') as HTMLInputElement;
    // Source: NIST SP 811 (2008): 1 lb = 0.453 592 37 kg, so $0.50/lb = $1.102/kg; a 60-lb wheat
    // bushel (USDA, shared/TRADE_FACTS.md §3) is 27.216 kg, so $8.00/bu = $293.9/t.
    expect(seed.value).toBe('1.102');
    expect(grain.value).toBe('293.9');
    expect(screen.getByText('$/kg')).toBeTruthy();
    expect(screen.getByText('$/t')).toBeTruthy();
    await user.clear(seed);
    await user.type(seed, '2');
    await user.clear(grain);
    await user.type(grain, '300');
    await user.click(screen.getByRole('button', { name: 'Recalculate' }));
    // $2.00/kg × 0.453 592 37 kg/lb = $0.907/lb; $300/t × 0.027 216 t/bu = $8.165/bu.
    expect(queries.at(-1)!.seedPrice).toBeCloseTo(0.90718474, 8);
    expect(queries.at(-1)!.grainPrice).toBeCloseTo(8.1646627, 6);
  });
});

describe('Price ratios on a metric pooled report', () => {
  const curves = (priceRatio: number) =>
    ({
      models: [],
      chosen: 'quadratic',
      intervalMethod: 'delta method',
      points: 12,
      sites: 3,
      testedRange: { low: 30, high: 240 },
      priceRatio,
      economicTable: [{ priceRatio, optimum: null }],
    }) as ResponseModels;

  it('gives seed $/kg ÷ grain $/kg whether grain was priced per tonne (t/ha) or per kg (kg/ha)', () => {
    // Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg. Seed at $1.10/kg and
    // grain at $260/t ($0.26/kg): the analysis of a t/ha report works with 1.10 ÷ 260 = 0.00423,
    // an older kg/ha report with 1.10 ÷ 0.26 = 4.231; both read 4.231 per kg ÷ per kg.
    for (const [ratio, yieldUnit] of [
      [1.1 / 260, 't/ha'],
      [1.1 / 0.26, 'kg/ha'],
    ] as const) {
      renderWithProviders(
        createElement(ResponseModelsSection, {
          curves: curves(ratio),
          seedUnit: 'kg/ha',
          metric: true,
          yieldUnit,
        }),
      );
      expect(screen.getByText('Seed price per kg ÷ grain price per kg')).toBeTruthy();
      expect(screen.getByText('4.231')).toBeTruthy();
      cleanup();
    }
  });
});
