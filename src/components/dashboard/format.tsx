/** Number words for the dashboard (pure). */
export const fmt = (x: number | null | undefined, dp = 0) =>
  x === null || x === undefined
    ? '—'
    : x.toLocaleString('en', { minimumFractionDigits: dp, maximumFractionDigits: dp });
export const pct = (x: number | null | undefined, dp = 1) =>
  x === null || x === undefined ? '—' : `${fmt(x * 100, dp)} %`;

/** Round axis ticks from `low` to `high` (about five steps of 1, 2 or 5 times a power of ten; common practice). */
export function niceTicks(low: number, high: number): number[] {
  const span = Math.max(high - low, 1);
  const raw = span / 5;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw)!;
  const out: number[] = [];
  for (let t = Math.floor(low / step) * step; t < high + step; t += step) out.push(t);
  return out;
}

/** Legend words in ink, whatever the series colour (light fills would be unreadable). */
export const inkLegend = (value: string) => <span className="text-ink">{value}</span>;
