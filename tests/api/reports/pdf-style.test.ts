// The PDF's print styles read Sheaf's colour tokens: no colour outside shared/brand/colours.ts.
import { describe, expect, it } from 'vitest';
import { PDF_STYLE } from '../../../api/reports/reports.pdf';
import { PRINT } from '../../../shared/brand/colours';

describe('PDF styles', () => {
  it('uses only the PRINT colour tokens', () => {
    // Common practice, no published source: one source of colour per design-token practice.
    const used = PDF_STYLE.match(/#[0-9a-fA-F]{3,8}\b/g) ?? [];
    expect(used.length).toBeGreaterThan(5);
    const tokens = new Set(Object.values(PRINT).map((c) => c.toLowerCase()));
    for (const colour of used) expect(tokens.has(colour.toLowerCase()), colour).toBe(true);
    expect(PDF_STYLE).not.toMatch(/rgb\(|hsl\(/);
  });
});
