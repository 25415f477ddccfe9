// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest';
import { systemForLocale } from '../../web/lib/unit-preference';

describe('systemForLocale', () => {
  it('starts imperial in the United States and where no region is named, metric elsewhere', () => {
    // Common practice, no published source: the United States, Liberia and Myanmar are the
    // countries usually listed as not having adopted the metric system for everyday use.
    expect(systemForLocale('en-US')).toBe('imperial');
    expect(systemForLocale('en')).toBe('imperial');
    expect(systemForLocale(undefined)).toBe('imperial');
    expect(systemForLocale('en-GB')).toBe('metric');
    expect(systemForLocale('fr-CA')).toBe('metric');
    expect(systemForLocale('es-419')).toBe('metric');
    expect(systemForLocale('not a tag!')).toBe('imperial');
  });
});
