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

/**
 * "The same figures as a table" under a chart: open when there is nothing to draw. Columns are
 * [heading, numeric?]; each row is its key and its cells in column order.
 */
export function FiguresTable({
  columns,
  rows,
  empty,
}: {
  columns: [string, boolean][];
  rows: { key: string | number; cells: React.ReactNode[] }[];
  empty: string;
}) {
  return (
    <details className="mt-2 text-sm" open={rows.length === 0 ? true : undefined}>
      <summary className="cursor-pointer">The same figures as a table</summary>
      <div className="overflow-x-auto">
        <table className="data-table mt-2">
          <thead>
            <tr>
              {columns.map(([h, num]) => (
                <th key={h} scope="col" className={num ? 'text-right' : undefined}>
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.key}>
                {r.cells.map((c, i) => (
                  <td key={i} className={columns[i]?.[1] ? 'text-right' : undefined}>
                    {c}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="text-muted">
                  {empty}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </details>
  );
}
