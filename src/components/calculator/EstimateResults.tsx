import type { z } from 'zod';
import type { estimateResponseSchema } from '~/lib/api/estimates';
import { FactorList } from './FactorList';
import { formatNumber } from './labels';
import { TrajectoryChart } from './TrajectoryChart';

export type Estimate = z.output<typeof estimateResponseSchema>;

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

const signed = (x: number, d = 1) => (x > 0 ? '+' : x < 0 ? '−' : '') + formatNumber(Math.abs(x), d);

export function EstimateResults({ result, transitionYears }: { result: Estimate; transitionYears: number }) {
  const lossShare = result.socBeforePerHa > 0 ? (result.socAfterPerHa - result.socBeforePerHa) / result.socBeforePerHa : 0;
  const emission = result.co2eTotal >= 0;
  return (
    <div className="flex flex-col gap-4" aria-live="polite">
      <section className="panel">
        <h2 className="mb-1">Result over {transitionYears} years</h2>
        <p className="mb-3 text-sm">
          <strong>{emission ? 'Net emission' : 'Net removal'}</strong> of {formatNumber(Math.abs(result.co2eTotal), 1)} t CO2e
          {result.uncertainty && (
            <>
              {' '}
              (95% range {formatNumber(result.uncertainty.co2eLow, 1)} to {formatNumber(result.uncertainty.co2eHigh, 1)} t CO2e, {result.uncertainty.runs} Monte Carlo runs, seed {result.uncertainty.seed})
            </>
          )}
          . Factor set <code>{result.factorSet.id}</code> version {result.factorSet.version}.
        </p>
        <dl className="grid grid-cols-2 gap-2 lg:grid-cols-4">
          <Figure label="Soil carbon before" value={formatNumber(result.socBeforePerHa, 1)} unit="t C/ha" />
          <Figure label="Soil carbon after" value={formatNumber(result.socAfterPerHa, 1)} unit="t C/ha" note={`${signed(lossShare * 100, 0)}% of the stock`} />
          <Figure label="Soil carbon change" value={signed(result.socChangeTotal)} unit="t C" note={`${signed(result.annualSocChange, 2)} t C per year`} />
          <Figure label="Biomass change" value={signed(result.biomassChangeTotal)} unit="t C" />
          <Figure label="N2O from mineralisation" value={formatNumber(result.n2oTotal * 1000, 1)} unit="kg N2O" />
          <Figure label="CO2e: soil" value={signed(result.co2eParts.soil)} unit="t" />
          <Figure label="CO2e: biomass" value={signed(result.co2eParts.biomass)} unit="t" />
          <Figure label="CO2e: N2O" value={signed(result.co2eParts.n2o)} unit="t" />
        </dl>
        {!result.signOffReady && (
          <p className="notice notice-warn mt-3 text-sm" role="note">
            <strong>Exploration only.</strong> Values this authority has not yet checked against the published document: {[...new Set(result.factors.filter((f) => f.status === 'unconfirmed').map((f) => `${f.role} (${f.source.table})`))].join('; ')} (marked “! not yet checked” below). An assessment built on them cannot be signed off until an administrator records the check.
          </p>
        )}
      </section>
      <section className="panel">
        <h2 className="mb-2">Year by year</h2>
        <TrajectoryChart points={result.trajectory} transitionYears={transitionYears} />
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
