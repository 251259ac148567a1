import { describe, expect, it } from 'vitest';
import { format } from 'd3';
import { formatNumber, formatShare, unsignedZero, withoutNegativeZero } from '../../../src/ui/plots/format-number.ts';

describe('formatNumber: never a negative zero', () => {
  it('prints values that round to zero unsigned, and other negatives with a minus sign (U+2212)', () => {
    expect(formatNumber(-0.04, 1)).toBe('0.0');
    expect(formatNumber(-0, 0)).toBe('0');
    expect([-0.3, -58.2, 15].map((v) => formatNumber(v, 0)).join(', ')).toBe('0, \u221258, 15');
    expect(formatNumber(-1.25, 1)).toBe('\u22121.3'); // toFixed rounds half away from zero here: -1.25 is -1.25 exactly in binary
    expect(formatNumber(NaN, 1)).toBe('n/a');
  });
  it('fixes d3-format, which prints −0 for a negative zero (d3-format README: "−0" is kept unless "(" or sign options)', () => {
    const fmt = withoutNegativeZero(format('.2~f'));
    expect(fmt(-0.001)).toBe('0');
    expect(fmt(-0.5)).toBe('\u22120.5');
    expect(unsignedZero('-0.00')).toBe('0.00');
    expect(unsignedZero('−10')).toBe('−10');
  });
  it('prints shares with a non-breaking space before %, never below 0', () => {
    expect(formatShare(0.123, 1)).toBe('12.3\u00a0%');
    expect(formatShare(-0.02)).toBe('0\u00a0%');
  });
});
