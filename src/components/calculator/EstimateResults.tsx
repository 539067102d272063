import { lazy, Suspense, useEffect, useRef } from 'react';
import type { z } from 'zod';
import type { estimateResponseSchema } from '~/lib/api/estimates';
import { EstimateInputs } from './EstimateInputs';
import { FactorList } from './FactorList';
import { formatNumber } from './labels';
import { formatRounded, roundingStep, roundTo } from './precision';

export type Estimate = z.output<typeof estimateResponseSchema>;

// recharts is fetched only once there is a result to draw (script budgets, DEVELOPERS.md).
const TrajectoryChart = lazy(() => import('./TrajectoryChart').then((m) => ({ default: m.TrajectoryChart })));

function Figure({ label, value, unit, note }: { label: string; value: string; unit: string; note?: string }) {
  return (
    <div className="rounded border border-line bg-white p-3">
      <dt className="text-xs font-medium text-muted">{label}</dt>
      <dd className="mt-0.5 text-xl font-semibold tabular-nums">
        {value} <span className="text-sm font-normal text-muted">{unit}</span>
      </dd>
      {note && <dd className="text-xs text-muted">{note}</dd>}
    </div>
  );
}

const sign = (x: number) => (x > 0 ? '+' : x < 0 ? '−' : '');

type Props = { result: Estimate; transitionYears: number; inputs: [string, string][]; onDownload: () => void };

export function EstimateResults({ result, transitionYears, inputs, onDownload }: Props) {
  const heading = useRef<HTMLHeadingElement>(null);
  // Keyboard and screen-reader users land on the result, not back at the top of the page.
  useEffect(() => heading.current?.focus(), [result]);
  const u = result.uncertainty;
  const range = u ? { low: u.co2eLow, high: u.co2eHigh } : null;
  const step = roundingStep(result.co2eTotal, range);
  const t = (x: number) => formatRounded(x, step);
  // The sign of the figure as shown: a part that rounds to nothing reads 0, not +0.
  const signedAt = (x: number, at: number) => sign(roundTo(x, at)) + formatRounded(Math.abs(x), at);
  const signedT = (x: number) => signedAt(x, step);
  const tC = (x: number) => signedAt(x, roundingStep(x));
  const lossShare =
    result.socBeforePerHa > 0 ? (result.socAfterPerHa - result.socBeforePerHa) / result.socBeforePerHa : 0;
  const emission = result.co2eTotal >= 0;
  return (
    <div className="flex flex-col gap-4">
      <section className="panel" aria-labelledby="result-heading">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <h2 id="result-heading" ref={heading} tabIndex={-1} className="mb-1">
            Result over {transitionYears} years
          </h2>
          <div className="no-print flex gap-2">
            <button type="button" className="btn btn-quiet" onClick={onDownload}>
              Download (JSON)
            </button>
            <button type="button" className="btn btn-quiet" onClick={() => window.print()}>
              Print
            </button>
          </div>
        </div>
        <p className="mb-3 text-sm" aria-live="polite">
          <strong>{emission ? 'Net emission' : 'Net removal'}</strong> of about {t(Math.abs(result.co2eTotal))} t CO2e
          {u ? (
            <>
              {' '}
              (95% range {t(u.co2eLow)} to {t(u.co2eHigh)} t CO2e, {u.runs} Monte Carlo runs, seed {u.seed})
            </>
          ) : (
            <> (no range computed: rounded to two significant figures)</>
          )}
          . Factor set <code>{result.factorSet.id}</code> version {result.factorSet.version}.
        </p>
        <dl className="grid grid-cols-2 gap-2 lg:grid-cols-4">
          <Figure label="Soil carbon before" value={formatNumber(result.socBeforePerHa, 1)} unit="t C/ha" />
          <Figure
            label="Soil carbon after"
            value={formatNumber(result.socAfterPerHa, 1)}
            unit="t C/ha"
            note={`${sign(lossShare)}${formatNumber(Math.abs(lossShare * 100), 0)}% of the stock`}
          />
          <Figure
            label="Soil carbon change"
            value={tC(result.socChangeTotal)}
            unit="t C"
            note={`${tC(result.annualSocChange)} t C per year`}
          />
          <Figure label="Biomass change" value={tC(result.biomassChangeTotal)} unit="t C" />
          <Figure
            label="N2O from mineralisation"
            value={formatRounded(result.n2oTotal * 1000, roundingStep(result.n2oTotal * 1000))}
            unit="kg N2O"
          />
          <Figure label="CO2e: soil" value={signedT(result.co2eParts.soil)} unit="t" />
          <Figure label="CO2e: biomass" value={signedT(result.co2eParts.biomass)} unit="t" />
          <Figure label="CO2e: N2O" value={signedT(result.co2eParts.n2o)} unit="t" />
        </dl>
        <p className="mt-2 text-xs text-muted">
          Figures are rounded to the place the uncertainty supports; the download carries them unrounded.
        </p>
        {!result.signOffReady && (
          <p className="notice notice-warn mt-3 text-sm" role="note">
            <strong>Exploration only.</strong> Values this authority has not yet checked against the published document:{' '}
            {[
              ...new Set(
                result.factors.filter((f) => f.status === 'unconfirmed').map((f) => `${f.role} (${f.source.table})`),
              ),
            ].join('; ')}{' '}
            (marked “! not yet checked” below). An assessment built on them cannot be signed off until an administrator
            records the check.
          </p>
        )}
      </section>
      <section className="panel" aria-labelledby="inputs-heading">
        <h2 id="inputs-heading" className="mb-2">
          What was estimated
        </h2>
        <EstimateInputs rows={inputs} />
      </section>
      <section className="panel">
        <h2 className="mb-2">Year by year</h2>
        <Suspense fallback={<p className="h-72 text-sm text-muted">Drawing the chart…</p>}>
          <TrajectoryChart points={result.trajectory} transitionYears={transitionYears} range={range} />
        </Suspense>
      </section>
      <section className="panel">
        <h2 className="mb-2">Cautions</h2>
        <ul className="list-disc space-y-1 pl-5 text-sm">
          {result.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
      <section className="panel">
        <h2 className="mb-2">Values used and their sources</h2>
        <FactorList factors={result.factors} />
      </section>
    </div>
  );
}
