import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { FiguresTable, fmt, inkLegend } from './format';

type Row = { year: number; convertedHa: number; restoredHa: number };

/** Hectares of grassland converted and restored per year of decision; the table carries the same figures. */
export function ChangesChart({ rows }: { rows: Row[] }) {
  return (
    <figure>
      {rows.length > 0 && (
        <div className="h-64 w-full" aria-hidden="true">
          <ResponsiveContainer width="100%" height="100%">
            <BarChart accessibilityLayer={false} data={rows} margin={{ top: 8, right: 8, bottom: 4, left: 0 }}>
              <CartesianGrid stroke="#d5d8d0" strokeDasharray="3 3" />
              <XAxis dataKey="year" tick={{ fontSize: 12 }} />
              <YAxis
                tick={{ fontSize: 12 }}
                width={44}
                label={{ value: 'ha', angle: -90, position: 'insideLeft', fontSize: 12 }}
              />
              <Tooltip formatter={(v) => `${fmt(Number(v), 2)} ha`} />
              <Legend wrapperStyle={{ fontSize: 12 }} formatter={inkLegend} />
              <Bar
                dataKey="convertedHa"
                name="Converted (grass to tilled use)"
                fill="#9a3b17"
                isAnimationActive={false}
              />
              <Bar
                dataKey="restoredHa"
                name="Restored (tilled land to grass)"
                fill="#245a41"
                stroke="#15382a"
                strokeDasharray="4 2"
                isAnimationActive={false}
              />
            </BarChart>
          </ResponsiveContainer>
        </div>
      )}
      <figcaption className="text-xs text-muted">
        From the register: approvals still in force, by the year the board decided; area of the parcels (or parts) in
        each decision.
      </figcaption>
      <FiguresTable
        columns={[
          ['Year', false],
          ['Converted, ha', true],
          ['Restored, ha', true],
        ]}
        rows={rows.map((r) => ({ key: r.year, cells: [r.year, fmt(r.convertedHa, 2), fmt(r.restoredHa, 2)] }))}
        empty="No approval in the register yet."
      />
    </figure>
  );
}
