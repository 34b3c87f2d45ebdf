import { describe, expect, it } from 'vitest';
import { formatMeanInterval, formatValue } from '../../runner/report/format-number.ts';

describe('formatValue', () => {
  it('shows three significant digits, exponents only for very small or large values', () => {
    expect(formatValue(0.123456)).toBe('0.123');
    expect(formatValue(12.3456)).toBe('12.3');
    expect(formatValue(1234.5)).toBe('1235');
    expect(formatValue(0.0000208)).toBe('2.08e-5');
    expect(formatValue(2.5e7)).toBe('2.50e+7');
    expect(formatValue(-0.0001e-9)).toBe('0.00');
    expect(formatValue(Number.NaN)).toBe('–');
  });
});

describe('formatMeanInterval', () => {
  it('gives mean and half-width the same decimals', () => {
    expect(formatMeanInterval(0.4, 0.341, 0.459).text).toBe('0.400 ± 0.059');
    expect(formatMeanInterval(1.0967, 1.076, 1.1174).text).toBe('1.097 ± 0.021');
  });

  it('never prints a run of zeros for a zero spread or a tiny p-value', () => {
    expect(formatMeanInterval(2.5, 2.5 - 1e-15, 2.5 + 1e-15).text).toBe('2.50 ± 0.00');
    expect(formatMeanInterval(2.1e-8, 1e-8, 3.2e-8).text).toBe('2.10e-8 ± 1.1e-8');
    expect(formatMeanInterval(0.3, Number.NaN, Number.NaN).text).toBe('0.300');
  });
});
