/** Number words for the dashboard (pure). */
export const fmt = (x: number | null | undefined, dp = 0) => (x === null || x === undefined ? '—' : x.toLocaleString('en', { minimumFractionDigits: dp, maximumFractionDigits: dp }));
export const pct = (x: number | null | undefined, dp = 1) => (x === null || x === undefined ? '—' : `${fmt(x * 100, dp)} %`);
