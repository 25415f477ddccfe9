// @vitest-environment happy-dom
// Component tests for the seed calculator and the seeder calibration helper: quiet until a box
// is changed, the shared number reading, and results that follow the boxes.
import { cleanup, screen } from '@testing-library/react';
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
