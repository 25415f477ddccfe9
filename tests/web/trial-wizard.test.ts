// @vitest-environment happy-dom
// Component tests for the trial wizard's steps: each step checks its own boxes with the API's
// field rules, says so under the box, moves focus to the first one, and follows the unit system.
import { cleanup, screen } from '@testing-library/react';
import { createElement } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { TrialWizard } from '../../web/features/trials/components/trial-wizard';
import { buildCoordinator, buildTrial, refuseFetch, renderWithProviders } from './render';

afterEach(cleanup);

const wizard = (props: Partial<Parameters<typeof TrialWizard>[0]> = {}) =>
  renderWithProviders(createElement(TrialWizard, { user: buildCoordinator(), ...props }));

describe('TrialWizard, step 1 (crop and season)', () => {
  it('asks for a name and a crop in plain words and focuses the name', async () => {
    const fetches = refuseFetch();
    const { user } = wizard();
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(await screen.findByText('Name the trial')).toBeTruthy();
    expect(screen.getByText('Choose a crop')).toBeTruthy();
    expect(screen.queryByText(/Invalid option/)).toBeNull();
    expect(document.activeElement).toBe(screen.getByLabelText(/Trial name/));
    expect(fetches.calls).toEqual([]);
  });

  it('drops the crop message once a crop is chosen', async () => {
    refuseFetch();
    const { user } = wizard();
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    await screen.findByText('Choose a crop');
    await user.selectOptions(screen.getByLabelText('Crop'), 'oats');
    expect(screen.queryByText('Choose a crop')).toBeNull();
  });

  it('asks a custom crop for its values', async () => {
    refuseFetch();
    const { user } = wizard();
    await user.type(screen.getByLabelText(/Trial name/), 'Invented spelt trial');
    await user.selectOptions(screen.getByLabelText('Crop'), 'custom');
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(await screen.findByText('Name the crop')).toBeTruthy();
    expect(screen.getAllByText('Fill this in').length).toBe(3);
  });
});

describe('TrialWizard, step 2 (rates)', () => {
  it('says "Enter a number" for letters, not "Fill this in"', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial(), initialStep: 1 });
    const rate = screen.getByLabelText(/Reference \(full\) rate/);
    await user.clear(rate);
    await user.type(rate, 'abc');
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(await screen.findByText('Enter a number')).toBeTruthy();
    expect(document.activeElement).toBe(rate);
  });

  it('refuses a thousands separator with the shared parser’s message', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial(), initialStep: 1 });
    const rate = screen.getByLabelText(/Reference \(full\) rate/);
    await user.clear(rate);
    await user.type(rate, '1,200');
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(
      await screen.findByText('Write 1234 or 1234.5, without thousands separators'),
    ).toBeTruthy();
  });

  it('refuses two levels with the same multiplier (the API’s list rule)', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial(), initialStep: 1 });
    const second = screen.getByLabelText('Level 2: times the full rate');
    await user.clear(second);
    await user.type(second, '0,5');
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(await screen.findByText('Each rate level needs a different multiplier')).toBeTruthy();
  });

  it('shows fixed levels as fixed when a site is randomized', () => {
    refuseFetch();
    wizard({ trial: buildTrial({ designLocked: true }), initialStep: 1 });
    const level = screen.getByLabelText(/Level 1: times the full rate/) as HTMLInputElement;
    expect(level.disabled).toBe(true);
    expect(screen.getAllByText('(fixed)').length).toBeGreaterThan(0);
  });
});

describe('TrialWizard, step 3 (strips)', () => {
  it('takes row spacing in cm and strip length in m for a metric trial', () => {
    refuseFetch();
    wizard({ trial: buildTrial({ unitSystem: 'metric' }), initialStep: 2 });
    const spacing = screen.getByLabelText(/Row spacing/) as HTMLInputElement;
    const length = screen.getByLabelText(/Strip length/) as HTMLInputElement;
    // Source: NIST SP 811 (2008), Appendix B.8: 8 in × 2.54 = 20.32 cm; 100 ft × 0.3048 = 30.48 m.
    expect(spacing.value).toBe('20.32');
    expect(length.value).toBe('30.48');
    expect(screen.getByText('cm')).toBeTruthy();
    expect(screen.getByText('m')).toBeTruthy();
  });

  it('gives a metric range message in metric units', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial({ unitSystem: 'metric' }), initialStep: 2 });
    const spacing = screen.getByLabelText(/Row spacing/);
    await user.clear(spacing);
    await user.type(spacing, '150');
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    // Source: NIST SP 811 (2008): the API's 40 in limit is 101.6 cm.
    expect(await screen.findByText('At most 101.6 cm')).toBeTruthy();
  });
});

describe('TrialWizard, step 4 (seed lot and prices)', () => {
  it('asks metric growers for prices per kg and per tonne', () => {
    refuseFetch();
    wizard({ trial: buildTrial({ unitSystem: 'metric' }), initialStep: 3 });
    expect(screen.getByText('$/kg')).toBeTruthy();
    expect(screen.getByText('$/t')).toBeTruthy();
  });

  it('counts a metric seed lot in seeds per kg', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial({ unitSystem: 'metric' }), initialStep: 3 });
    await user.click(screen.getByLabelText('By count (seeds per kg)'));
    // Source: NIST SP 811 (2008): 1 kg = 1,000 g; 32-g kernels are 1,000 ÷ 0.032 = 31,250 per kg.
    expect((screen.getByLabelText('Seeds per kg') as HTMLInputElement).value).toBe('31250');
    expect(screen.queryByText(/seeds per lb/i)).toBeNull();
  });

  it('asks for germination when it is empty', async () => {
    refuseFetch();
    const { user } = wizard({ trial: buildTrial({ germinationPct: undefined }), initialStep: 3 });
    await user.click(screen.getByRole('button', { name: 'Save and continue' }));
    expect(await screen.findByText('Fill this in')).toBeTruthy();
    expect(document.activeElement).toBe(screen.getByLabelText(/Germination/));
  });
});

describe('TrialWizard, step 5 (summary)', () => {
  it('lists the design with prices in cents and seed for every rate', () => {
    refuseFetch();
    wizard({ trial: buildTrial(), initialStep: 4 });
    expect(screen.getByText(/seed \$0\.90\/lb, grain \$4\.00\/bu/)).toBeTruthy();
    expect(screen.getByRole('table', { name: 'Seed amounts per rate level' })).toBeTruthy();
  });

  it('sends a coordinator back to the first step that is not ready', async () => {
    const fetches = refuseFetch();
    const { user } = wizard({ trial: buildTrial({ rowsPerStrip: undefined }), initialStep: 4 });
    await user.click(screen.getByRole('button', { name: 'Send to the field' }));
    expect(await screen.findByRole('heading', { name: /Step 3 of 5/ })).toBeTruthy();
    expect(await screen.findByText('Fill this in')).toBeTruthy();
    expect(fetches.calls).toEqual([]);
  });
});
