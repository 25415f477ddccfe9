// @vitest-environment happy-dom
// Component tests for the strip grid and the strip form after their split into small parts:
// one Tab stop with arrow keys, pasting a block, typed text that cannot be saved, metric units
// on every heading, waiting and not-saved states, and plot numbers in field order.
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { createElement } from 'react';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { StripForm } from '../../web/features/collect/components/strip-form';
import { StripGrid } from '../../web/features/collect/components/strip-grid';
import { discardEdits } from '../../web/features/collect/lib/outbox';
import { clearUnsaved, useUnsavedFields } from '../../web/features/collect/lib/unsaved-fields';
import { buildSiteStrips } from './collect-builders';
import { renderWithProviders } from './render';

const data = buildSiteStrips('metric');

/** Every field not saved, read through the hook the page's save state uses. */
let unsaved: ReturnType<typeof useUnsavedFields> = [];
function UnsavedProbe() {
  unsaved = useUnsavedFields();
  return null;
}

beforeEach(() => {
  // The photo list is the only request these components make: answer it with no photos.
  globalThis.fetch = (async () =>
    new Response('[]', {
      status: 200,
      headers: { 'content-type': 'application/json' },
    })) as typeof fetch;
});

afterEach(() => {
  cleanup();
  for (const strip of data.strips) discardEdits(strip.stripId);
  for (const field of unsaved) clearUnsaved(field.key);
});

const cell = (name: string) => document.querySelector<HTMLInputElement>(`[data-cell="${name}"]`)!;

function renderGrid() {
  return renderWithProviders(
    createElement('div', null, createElement(StripGrid, { data }), createElement(UnsavedProbe)),
  );
}

describe('StripGrid', () => {
  it('lists the plots in field order with metric headings', () => {
    renderGrid();
    const rows = within(screen.getByTestId('strip-grid')).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.querySelector('td .font-semibold')?.textContent)).toEqual([
      '101',
      '102',
      '201',
      '202',
    ]);
    for (const heading of ['Stand row (m)', 'Grain (kg)', 'plants/m²', 'Yield t/ha'])
      expect(screen.getByText(heading)).toBeTruthy();
    expect(screen.queryByText(/\(ft\)|\(lb\)|bu\/acre/)).toBeNull();
  });

  it('is one Tab stop, and arrow keys and Enter move between cells', () => {
    renderGrid();
    const stops = [...document.querySelectorAll('[data-cell]')].filter(
      (el) => (el as HTMLInputElement).tabIndex === 0,
    );
    expect(stops.map((el) => el.getAttribute('data-cell'))).toEqual(['0:0']);
    cell('0:0').focus();
    fireEvent.keyDown(cell('0:0'), { key: 'ArrowDown' });
    expect(document.activeElement).toBe(cell('1:0'));
    fireEvent.keyDown(cell('1:0'), { key: 'ArrowRight' });
    expect(document.activeElement).toBe(cell('1:1'));
    fireEvent.keyDown(cell('1:1'), { key: 'Enter' });
    expect(document.activeElement).toBe(cell('2:1'));
    fireEvent.keyDown(cell('2:1'), { key: 'Enter', shiftKey: true });
    expect(document.activeElement).toBe(cell('1:1'));
    // The Tab stop follows focus, so Tab comes back to the last cell used.
    expect(cell('1:1').tabIndex).toBe(0);
    expect(cell('0:0').tabIndex).toBe(-1);
  });

  it('fills strips and columns from a pasted block and lists the cells it could not take', () => {
    renderGrid();
    // Columns 1 and 2 are stand counts 1 and 2 (column 0 is seeds sown).
    fireEvent.paste(cell('0:1'), {
      clipboardData: { getData: () => '12\t14\n15\tabc\n' },
    });
    expect(cell('0:1').value).toBe('12');
    expect(cell('0:2').value).toBe('14');
    expect(cell('1:1').value).toBe('15');
    expect(cell('1:2').value).toBe('');
    expect(screen.getAllByTitle('Waiting to be sent')).toHaveLength(2);
    expect(screen.getByText('Some pasted cells were not taken')).toBeTruthy();
    expect(screen.getByText(/^Plot 102, stand_2: Enter a number \("abc"\)$/)).toBeTruthy();
  });

  it('keeps typed text that cannot be saved and says why in the cell name', () => {
    renderGrid();
    fireEvent.change(cell('0:1'), { target: { value: '-5' } });
    expect(cell('0:1').value).toBe('-5');
    expect(cell('0:1').getAttribute('aria-label')).toBe(
      'Plot 101, Stand 1, not saved: Cannot be negative',
    );
    expect(unsaved.map((f) => f.place)).toEqual(['Plot 101, Stand 1']);
    expect(screen.queryByTitle('Waiting to be sent')).toBeNull();
    fireEvent.change(cell('0:1'), { target: { value: '7' } });
    expect(cell('0:1').getAttribute('aria-invalid')).toBeNull();
    expect(unsaved).toEqual([]);
    expect(screen.getAllByTitle('Waiting to be sent')).toHaveLength(1);
  });
});

describe('StripForm', () => {
  const strip = data.strips.find((s) => s.plotNumber === 102)!;

  it('labels every value in metric units and links the neighbouring plots', () => {
    renderWithProviders(createElement(StripForm, { data, strip }));
    expect(screen.getByText('Plants per m²')).toBeTruthy();
    expect(screen.getByText('Heads per m²')).toBeTruthy();
    expect(screen.getByText('Yield, t/ha')).toBeTruthy();
    expect(screen.queryByText(/per ft²|bu\/acre/)).toBeNull();
    // Yield only in t/ha, as the metric reports give it (kg/ha is left to the seed rate).
    expect(screen.queryByText('Yield, kg/ha')).toBeNull();
    const nav = screen.getByRole('navigation', { name: 'Other strips' });
    expect(within(nav).getByRole('link', { name: '← Plot 101' })).toBeTruthy();
    expect(within(nav).getByRole('link', { name: 'Plot 201 →' })).toBeTruthy();
  });

  it('says a typed count is waiting, and a wrong one is not saved with why', async () => {
    const { user } = renderWithProviders(
      createElement(
        'div',
        null,
        createElement(StripForm, { data, strip }),
        createElement(UnsavedProbe),
      ),
    );
    const [first, second] = screen.getAllByLabelText(/^Count [12]$/);
    await user.type(first!, '14');
    expect(first!.getAttribute('data-state')).toBe('waiting');
    // Every box of the stand counts shares the one waiting list.
    expect(screen.getAllByText('Kept on this device, waiting to be sent').length).toBeGreaterThan(
      0,
    );
    await user.type(second!, '1x');
    expect(second!.getAttribute('data-state')).toBe('not-saved');
    expect(screen.getByText('Not saved: Enter a number')).toBeTruthy();
    expect(unsaved.map((f) => f.place)).toEqual(['Plot 102, Count 2']);
  });
});
