/** Number formatting for the plain-words reasons of a grade (pure, fixed locale so texts are stable). */
const nf = (dp: number) => new Intl.NumberFormat('en-GB', { minimumFractionDigits: 0, maximumFractionDigits: dp });
const HA = nf(2);
const T = nf(0);
const T1 = nf(1);
const PCT = nf(1);
const RATIO = nf(3);

export const fmtHa = (ha: number) => `${HA.format(ha)} ha`;
export const fmtT = (t: number) => T.format(t);
export const fmtT1 = (t: number) => T1.format(t);
export const fmtPct = (share: number) => `${PCT.format(share * 100)} %`;
export const fmtRatio = (r: number) => RATIO.format(r);

/**
 * Thresholds are compared with a tolerance of 1e-9, so floating-point noise in a computed
 * figure (0.05000000000000002 for an exact 5 % fall) never moves it across a boundary.
 */
const TOLERANCE = 1e-9;
export const moreThan = (value: number, limit: number) => value > limit + TOLERANCE;
export const atLeast = (value: number, limit: number) => value >= limit - TOLERANCE;

/** "a, b and c" */
export function listWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}
