// @vitest-environment happy-dom
// Component tests for the seed calculator and the seeder calibration helper: quiet until a box
// is changed, the shared number reading, and results that follow the boxes.
import { cleanup, screen, within } from '@testing-library/react';
import { createElement } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { CalibrationHelper } from '../../web/features/calculator/components/calibration-helper';
import { SeedCalculator } from '../../web/features/calculator/components/seed-calculator';
import { PowerPlanner } from '../../web/features/trials/components/power-planner';
import { refuseFetch, renderWithProviders } from './render';

afterEach(cleanup);

describe('SeedCalculator', () => {
  it('shows results and no message before anything is typed', () => {
    refuseFetch();
    renderWithProviders(createElement(SeedCalculator));
    expect(screen.getByTestId('calc-results')).toBeTruthy();
    expect(screen.queryByText('▲', { exact: false })).toBeNull();
  });

  it('reads a decimal comma and says "Enter a number" for letters', async () => {
    refuseFetch();
    const { user } = renderWithProviders(createElement(SeedCalculator));
    const amount = screen.getByLabelText('Amount');
    await user.clear(amount);
    await user.type(amount, 'lots');
    expect(await screen.findByText('Enter a number')).toBeTruthy();
    await user.clear(amount);
    await user.type(amount, '96,5');
    expect(screen.queryByText('Enter a number')).toBeNull();
    expect(screen.getByTestId('calc-results')).toBeTruthy();
  });
});

describe('CalibrationHelper', () => {
  it('shows no error on /calibrate before anything is typed', () => {
    refuseFetch();
    renderWithProviders(createElement(CalibrationHelper, { user: null, initialSiteId: null }));
    expect(screen.queryByText(/Enter the seeds you counted$/)).toBeNull();
    expect(
      screen.getByText('Enter the seeds you counted to see how close the seeder is.'),
    ).toBeTruthy();
  });

  it('works out percent of target from the seeds counted', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(CalibrationHelper, { user: null, initialSiteId: null }),
    );
    await user.type(screen.getByLabelText('Seeds counted'), '150');
    // Common practice, no published source: 5 turns of a 3-ft wheel is 15 ft of row; a target of
    // 10 seeds/ft is 150 seeds, so 150 counted is 100 %.
    expect((await screen.findByTestId('percent-of-target')).textContent).toBe('100 %');
  });
});

describe('CalibrationHelper in metric units', () => {
  it('takes metres, centimetres and seeds per metre, and gives seeds per m²', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(CalibrationHelper, { user: null, initialSiteId: null }),
    );
    await user.selectOptions(screen.getByLabelText('Units'), 'metric');
    expect((screen.getByLabelText('Wheel circumference') as HTMLInputElement).value).toBe('1');
    expect(screen.getByText('seeds/m')).toBeTruthy();
    expect(screen.getByText('cm')).toBeTruthy();
    await user.type(screen.getByLabelText('Seeds counted'), '150');
    // Source: NIST SP 811 (2008), Appendix B.8 (1 ft = 0.3048 m, 1 in = 2.54 cm, exact), through
    // which the boxes are stored in feet and inches. By hand: 5 turns of a 1 m wheel is 5 m of
    // row; 150 seeds is 30 per metre, the target, so 100 %; 30 seeds per metre in 20 cm rows is
    // 30 ÷ 0.20 m = 150 seeds/m².
    expect((await screen.findByTestId('percent-of-target')).textContent).toBe('100 %');
    expect(screen.getByText('Delivered per metre of row').nextSibling?.textContent).toBe('30');
    expect(screen.getByText('Delivered per m²').nextSibling?.textContent).toBe('150');
    const results = within(screen.getByRole('region', { name: 'How close are you?' }));
    expect(results.queryByText(/per foot|ft²/)).toBeNull();
  });
});

describe('PowerPlanner', () => {
  it('says "Enter a number" for letters in a percentage box', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(PowerPlanner, { rates: 4, blocksPerSite: 4 }),
    );
    const cv = screen.getByLabelText('Expected CV');
    await user.clear(cv);
    await user.type(cv, 'ten');
    expect(await screen.findByText('Enter a number')).toBeTruthy();
  });
});
