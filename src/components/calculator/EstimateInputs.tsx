import type { CalculatorValues } from './form-model';
import {
  CLIMATE_LABELS,
  CROP_INPUT_LABELS,
  GRASS_INPUT_LABELS,
  GWP_LABELS,
  MANAGEMENT_LABELS,
  SOIL_LABELS,
  SYSTEM_LABELS,
  TILLAGE_LABELS,
} from './labels';
import { formatNumber } from './labels';

type Side = CalculatorValues['before'];

export function landUseText(s: Side): string {
  return s.landUse === 'grassland'
    ? `Grassland, ${MANAGEMENT_LABELS[s.management].toLowerCase()}, ${GRASS_INPUT_LABELS[s.grassInput].toLowerCase()} input`
    : `Cropland, ${SYSTEM_LABELS[s.system].toLowerCase()}, ${TILLAGE_LABELS[s.tillage].toLowerCase()}, ${CROP_INPUT_LABELS[s.cropInput].toLowerCase()} input`;
}

/** The inputs an estimate was computed from, in words, as pairs for the page and the download. */
export function inputRows(v: CalculatorValues, setTitle: string): [string, string][] {
  return [
    ['Factor set', setTitle],
    ['IPCC climate region', CLIMATE_LABELS[v.climate]],
    ['Soils', v.soils.map((s) => `${SOIL_LABELS[s.type]} ${formatNumber(s.percent, 0)}%`).join('; ')],
    ['Area', `${formatNumber(v.areaHa, 2)} ha`],
    ['Now', landUseText(v.before)],
    ['Proposed', landUseText(v.after)],
    ['Transition period D', `${v.transitionYears} years`],
    ['Global warming potentials', GWP_LABELS[v.gwp]],
    [
      'Counted',
      [v.biomass && 'biomass at conversion', v.n2o && 'N2O from mineralised nitrogen', 'soil carbon']
        .filter(Boolean)
        .join(', '),
    ],
    ['Uncertainty', v.withUncertainty ? `95% range from ${v.runs} Monte Carlo runs, seed ${v.seed}` : 'not computed'],
  ];
}

/** The inputs restated beside the result, so a printed or copied result carries what it answers. */
export function EstimateInputs({ rows }: { rows: [string, string][] }) {
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="font-medium text-muted">{k}</dt>
          <dd className="mb-1 sm:mb-0">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
