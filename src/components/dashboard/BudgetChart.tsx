import {
  Bar,
  CartesianGrid,
  ComposedChart,
  Legend,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { FiguresTable, fmt, inkLegend, niceTicks, pct } from './format';

type Row = { year: number; committedT: number; leftT: number | null; usedShare: number | null };

/** CO2e committed by approvals per budget year against the authority's yearly budget (dashed line). */
export function BudgetChart({ rows, budgetT }: { rows: Row[]; budgetT: number | null }) {
  // Round ticks from 0 up past the budget; a year with a net gain (restorations) dips below 0 without a tick of its own.
  const ticks = niceTicks(0, Math.max(budgetT ?? 0, ...rows.map((r) => r.committedT)) * 1.05);
  const low = Math.min(0, ...rows.map((r) => r.committedT * 1.15));
  return (
    <figure>
      {rows.length > 0 && (
        <div className="h-64 w-full" aria-hidden="true">
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart accessibilityLayer={false} data={rows} margin={{ top: 16, right: 8, bottom: 4, left: 8 }}>
              <CartesianGrid stroke="#d5d8d0" strokeDasharray="3 3" />
              <XAxis dataKey="year" tick={{ fontSize: 12 }} />
              <YAxis
                tick={{ fontSize: 12 }}
                width={56}
                domain={[low, ticks[ticks.length - 1]!]}
                ticks={ticks}
                tickFormatter={(v) => fmt(Number(v))}
              />
              <Tooltip formatter={(v) => `${fmt(Number(v))} t CO2e`} />
              <Legend wrapperStyle={{ fontSize: 12 }} formatter={inkLegend} />
              <Bar dataKey="committedT" name="Committed, t CO2e" fill="#6b4a2b" isAnimationActive={false} />
              {budgetT !== null && (
                <ReferenceLine
                  y={budgetT}
                  stroke="#1d2320"
                  strokeWidth={2}
                  strokeDasharray="8 4"
                  label={{ value: `Budget ${fmt(budgetT)} t`, position: 'insideTopRight', fontSize: 12 }}
                />
              )}
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      )}
      <figcaption className="text-xs text-muted">
        Central estimates of the approvals still in force, by the year the change starts (the budget year).{' '}
        {budgetT === null
          ? 'No yearly budget is set.'
          : `Dashed line: the yearly budget of ${fmt(budgetT)} t CO2e set by the authority.`}{' '}
        Restorations count as negative emissions.
      </figcaption>
      <FiguresTable
        columns={[
          ['Budget year', false],
          ['Committed, t CO2e', true],
          ['Left, t CO2e', true],
          ['Budget used', true],
        ]}
        rows={rows.map((r) => ({ key: r.year, cells: [r.year, fmt(r.committedT), fmt(r.leftT), pct(r.usedShare)] }))}
        empty="No approval in the register yet."
      />
    </figure>
  );
}
