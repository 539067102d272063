/**
 * Rounding a figure to what its uncertainty supports (pure). With a 95 % range, the range's
 * half-width is kept to two significant digits and the figure and both ends are rounded to the
 * same place (JCGM 100:2008, the GUM, 7.2.6: an uncertainty needs at most two significant digits,
 * the estimate is given to the same place). Without a range, a Tier 1 figure, uncertain by tens of
 * percent, is kept to two significant digits (common practice).
 */
import { formatNumber } from './labels';

/** The place to round to: a power of ten (100, 1, 0.01 …); 0 when there is nothing to round. */
export function roundingStep(value: number, range?: { low: number; high: number } | null): number {
  const spread = range ? Math.abs(range.high - range.low) / 2 : Math.abs(value);
  if (!(spread > 0) || !Number.isFinite(spread)) return 0;
  return 10 ** (Math.floor(Math.log10(spread)) - 1);
}

export function roundTo(x: number, step: number): number {
  if (!step) return x;
  const r = Math.round(x / step) * step;
  // Float noise (0.1 * 3) and negative zero out.
  return Number(r.toPrecision(12)) + 0;
}

/** Decimals to show a figure rounded to `step` with: 0 for steps of 1 and above. */
export function decimalsFor(step: number): number {
  return step > 0 && step < 1 ? Math.round(-Math.log10(step)) : 0;
}

/** A figure rounded to `step` and formatted (thousands separators, en-GB). */
export function formatRounded(x: number, step: number): string {
  return formatNumber(roundTo(x, step), decimalsFor(step));
}
