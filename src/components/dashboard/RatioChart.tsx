import { Bar, CartesianGrid, ComposedChart, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { FiguresTable, inkLegend, pct } from './format';

type Row = {
  key: string;
  label: string;
  referenceRatio: number | null;
  referenceYear: number | null;
  referenceSource: string | null;
  ratioNow: number | null;
  ratioAfterPending: number | null;
  limitRatio: number | null;
};

/** Each region's permanent-grassland ratio now and after approved conversions, against its reference ratio and the limit. */
export function RatioChart({ rows, maxRelativeFall }: { rows: Row[]; maxRelativeFall: number | null }) {
  const data = rows.map((r) => ({
    ...r,
    now: r.ratioNow,
    after: r.ratioAfterPending,
    reference: r.referenceRatio,
    limit: r.limitRatio,
  }));
  return (
    <figure>
      {rows.length > 0 && (
        <div className="h-72 w-full" aria-hidden="true">
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart accessibilityLayer={false} data={data} margin={{ top: 8, right: 8, bottom: 4, left: 0 }}>
              <CartesianGrid stroke="#d5d8d0" strokeDasharray="3 3" />
              <XAxis dataKey="label" tick={{ fontSize: 12 }} />
              <YAxis
                tick={{ fontSize: 12 }}
                width={44}
                domain={[0, 1]}
                tickFormatter={(v) => `${Math.round(Number(v) * 100)} %`}
              />
              <Tooltip formatter={(v) => pct(Number(v))} />
              <Legend wrapperStyle={{ fontSize: 12 }} formatter={inkLegend} />
              <Bar
                dataKey="reference"
                name="Reference year"
                fill="#d6e8dc"
                stroke="#245a41"
                isAnimationActive={false}
              />
              <Bar dataKey="now" name="Now (land-use record)" fill="#2f6b4f" isAnimationActive={false} />
              <Bar dataKey="after" name="After approved conversions" fill="#6b4a2b" isAnimationActive={false} />
              {/* The limit as a dashed mark across the region's group: a bar drawn as its top edge only. */}
              <Bar
                dataKey="limit"
                name="Limit"
                fill="#9a3b17"
                legendType="plainline"
                isAnimationActive={false}
                shape={(p: {
                  x?: number | null;
                  y?: number | null;
                  background?: { x?: number | null; width?: number | null };
                }) => {
                  const x = p.background?.x ?? p.x ?? 0;
                  return (
                    <line
                      x1={x}
                      x2={x + (p.background?.width ?? 0)}
                      y1={p.y ?? 0}
                      y2={p.y ?? 0}
                      stroke="#9a3b17"
                      strokeWidth={3}
                      strokeDasharray="6 3"
                    />
                  );
                }}
              />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      )}
      <figcaption className="text-xs text-muted">
        Ratio = permanent grassland ÷ agricultural area.{' '}
        {maxRelativeFall === null
          ? 'The default rule set has no ratio rule, so no limit is drawn.'
          : `Dashed red mark: the limit, ${pct(maxRelativeFall, 0)} below the reference ratio (the default rule set’s ratio rule).`}
      </figcaption>
      <FiguresTable
        columns={[
          ['Region', false],
          ['Reference', true],
          ['Limit', true],
          ['Now', true],
          ['After approvals', true],
          ['Reference figure from', false],
        ]}
        rows={rows.map((r) => ({
          key: r.key,
          cells: [
            r.label,
            `${pct(r.referenceRatio)}${r.referenceYear ? ` (${r.referenceYear})` : ''}`,
            pct(r.limitRatio),
            pct(r.ratioNow),
            pct(r.ratioAfterPending),
            r.referenceSource ?? 'No reference ratio yet',
          ],
        }))}
        empty="No accounting-region layer is published."
      />
    </figure>
  );
}
