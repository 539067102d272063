import {
  CartesianGrid,
  Line,
  LineChart,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { formatNumber } from './labels';
import { formatRounded, roundingStep } from './precision';

type Point = { year: number; socPerHa: number; co2eCumulative: number };

type Range = { low: number; high: number } | null;

/**
 * Soil carbon per hectare and cumulative CO2e, year by year, with the 95 % range of the total drawn
 * from the end of the transition on; the table below carries the same numbers for screen readers.
 */
export function TrajectoryChart({
  points,
  transitionYears,
  range,
}: {
  points: Point[];
  transitionYears: number;
  range: Range;
}) {
  const lastYear = points.at(-1)?.year ?? transitionYears;
  const bandFrom = transitionYears < lastYear ? transitionYears : Math.max(points[0]?.year ?? 0, lastYear - 1);
  const step = range ? roundingStep(0, range) : 0;
  return (
    <figure>
      <p className="mb-1 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-hidden="true">
        <span className="flex items-center gap-1.5">
          <svg width="24" height="6">
            <line x1="0" y1="3" x2="24" y2="3" stroke="#245a41" strokeWidth="2.5" />
          </svg>
          Soil carbon, t C/ha (left axis)
        </span>
        <span className="flex items-center gap-1.5">
          <svg width="24" height="6">
            <line x1="0" y1="3" x2="24" y2="3" stroke="#9a3b17" strokeWidth="2" strokeDasharray="6 3" />
          </svg>
          Cumulative emission, t CO2e (right axis)
        </span>
        {range && (
          <span className="flex items-center gap-1.5">
            <svg width="24" height="10">
              <rect
                x="0"
                y="0"
                width="24"
                height="10"
                fill="#9a3b17"
                fillOpacity="0.15"
                stroke="#9a3b17"
                strokeDasharray="2 2"
              />
            </svg>
            95% range of the total emission
          </span>
        )}
      </p>
      <div className="h-72 w-full" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart accessibilityLayer={false} data={points} margin={{ top: 8, right: 12, bottom: 18, left: 4 }}>
            <CartesianGrid stroke="#d5d8d0" strokeDasharray="3 3" />
            <XAxis
              dataKey="year"
              tick={{ fontSize: 12 }}
              label={{ value: 'Years after the change', position: 'insideBottom', offset: -10, fontSize: 12 }}
            />
            <YAxis
              yAxisId="soc"
              tick={{ fontSize: 12 }}
              width={48}
              label={{ value: 't C/ha', angle: -90, position: 'insideLeft', fontSize: 12 }}
            />
            <YAxis
              yAxisId="co2e"
              orientation="right"
              tick={{ fontSize: 12 }}
              width={60}
              label={{ value: 't CO2e', angle: 90, position: 'insideRight', fontSize: 12 }}
            />
            <Tooltip formatter={(v) => formatNumber(Number(v), 2)} labelFormatter={(y) => `Year ${y}`} />
            <ReferenceLine
              yAxisId="soc"
              x={transitionYears}
              stroke="#55605a"
              strokeDasharray="4 4"
              label={{ value: `D = ${transitionYears}`, fontSize: 11, position: 'top' }}
            />
            {range && (
              <ReferenceArea
                yAxisId="co2e"
                x1={bandFrom}
                x2={lastYear}
                y1={range.low}
                y2={range.high}
                fill="#9a3b17"
                fillOpacity={0.15}
                stroke="#9a3b17"
                strokeDasharray="2 2"
                ifOverflow="extendDomain"
              />
            )}
            <Line
              yAxisId="soc"
              type="linear"
              dataKey="socPerHa"
              name="Soil carbon, t C/ha (mineral, 0-30 cm)"
              stroke="#245a41"
              strokeWidth={2.5}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              yAxisId="co2e"
              type="linear"
              dataKey="co2eCumulative"
              name="Cumulative emission, t CO2e"
              stroke="#9a3b17"
              strokeWidth={2}
              strokeDasharray="6 3"
              dot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-muted">
        Solid line: soil organic carbon per hectare. Dashed line: cumulative CO2-equivalent over the area (positive =
        emission). The change runs linearly for D years, then the soil stays at its new equilibrium.
        {range &&
          ` Shaded band: the 95% range of the total, ${formatRounded(range.low, step)} to ${formatRounded(range.high, step)} t CO2e, from year D on.`}
      </figcaption>
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer">The same figures as a table</summary>
        <table className="data-table mt-2">
          <thead>
            <tr>
              <th scope="col">Year</th>
              <th scope="col" className="num">
                Soil carbon, t C/ha
              </th>
              <th scope="col" className="num">
                Cumulative t CO2e
              </th>
            </tr>
          </thead>
          <tbody>
            {points.map((p) => (
              <tr key={p.year}>
                <td>{p.year}</td>
                <td className="num">{formatNumber(p.socPerHa, 2)}</td>
                <td className="num">{formatNumber(p.co2eCumulative, 1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
