import { describe, expect, it } from 'vitest';
import {
  NOT_A_NUMBER_MESSAGE,
  THOUSANDS_MESSAGE,
  parseDecimal,
} from '../../../shared/units/parse-decimal';

describe('parseDecimal', () => {
  it('reads a decimal point and a decimal comma as the same number', () => {
    expect(parseDecimal('12.5')).toEqual({ ok: true, value: 12.5 });
    expect(parseDecimal('12,5')).toEqual({ ok: true, value: 12.5 });
    expect(parseDecimal(' 0,125 ')).toEqual({ ok: true, value: 0.125 });
    expect(parseDecimal('-3')).toEqual({ ok: true, value: -3 });
    expect(parseDecimal('1234')).toEqual({ ok: true, value: 1234 });
  });

  it('reads an empty box as no value', () => {
    expect(parseDecimal('  ')).toEqual({ ok: true, value: null });
  });

  it('refuses thousands separators and mixed separators instead of guessing', () => {
    for (const text of ['1,234', '12,500', '1.234,5', '1,234.5', '1 234', "1'234", '1.234.567']) {
      expect(parseDecimal(text), text).toEqual({ ok: false, message: THOUSANDS_MESSAGE });
    }
  });

  it('asks for a number when letters are typed', () => {
    for (const text of ['abc', '12a', '1e5x', '--2', '.', 'NaN', 'Infinity']) {
      expect(parseDecimal(text), text).toEqual({ ok: false, message: NOT_A_NUMBER_MESSAGE });
    }
  });
});
