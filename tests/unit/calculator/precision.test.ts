import { describe, expect, it } from 'vitest';
import { decimalsFor, formatRounded, roundingStep, roundTo } from '../../../src/components/calculator/precision';

// Rule: JCGM 100:2008 (GUM) 7.2.6 — quote an uncertainty to at most two significant digits and the
// estimate to the same decimal place; without a range, two significant digits (common practice).
describe('rounding to the precision the uncertainty supports', () => {
  it('gives 1,400 t for 1,427.0 t with a range of 514 to 2,715', () => {
    const step = roundingStep(1427.0, { low: 514, high: 2715 });
    expect(step).toBe(100); // half-width 1,100.5 → two significant digits → hundreds
    expect(formatRounded(1427.0, step)).toBe('1,400');
    expect(formatRounded(514, step)).toBe('500');
    expect(formatRounded(2715, step)).toBe('2,700');
  });

  it('keeps decimals when the range is narrow', () => {
    const step = roundingStep(12.3456, { low: 12.0, high: 12.7 }); // half-width 0.35
    expect(step).toBeCloseTo(0.01, 12);
    expect(decimalsFor(step)).toBe(2);
    expect(formatRounded(12.3456, step)).toBe('12.35');
  });

  it('rounds a figure without a range to two significant digits', () => {
    expect(formatRounded(1427, roundingStep(1427))).toBe('1,400');
    expect(formatRounded(-0.04567, roundingStep(-0.04567))).toBe('-0.046');
    expect(roundTo(0.1 * 3, 0.1)).toBe(0.3);
  });

  it('leaves zero and a zero-width range alone', () => {
    expect(roundingStep(0)).toBe(0);
    expect(roundingStep(5, { low: 5, high: 5 })).toBe(0);
    expect(formatRounded(0, 0)).toBe('0');
  });
});
