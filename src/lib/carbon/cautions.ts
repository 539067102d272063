import { regimeFor } from './climate-regimes';
import type { Plan } from './plan';
import type { EstimateRequest } from './schemas';
import type { UsedFactor } from './types';

/** Cautions shown with every estimate. */
export const STANDARD_CAUTIONS = [
  'Tier 1 estimate: IPCC default factors carry wide uncertainty (reference soil stocks alone are ±90%); use the ' +
    'figures for screening, not as a measured result.',
  'Not a substitute for a site survey or soil sampling: local soil carbon, drainage and history can differ widely from the defaults.',
  'Defer to local law and to licensed professionals: this estimate informs a decision, it does not make one.',
] as const;

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6)));
}

/** Cautions specific to this request and the values used. */
export function cautionsFor(req: EstimateRequest, plan: Plan, used: UsedFactor[]): string[] {
  const out: string[] = [...STANDARD_CAUTIONS];
  const unchecked = new Map<string, UsedFactor[]>();
  for (const f of used.filter((x) => x.status === 'unconfirmed')) {
    const table = `${f.source.table}${f.source.chapter ? ` (${f.source.chapter})` : ''}`;
    unchecked.set(table, [...(unchecked.get(table) ?? []), f]);
  }
  if (unchecked.size)
    out.push(
      `Values not yet checked by this authority against the published tables, so fine for exploration but not for ` +
        `a signed assessment: ${[...unchecked]
          .map(([table, fs]) => `${table}: ${fs.map((f) => `${f.role} ${fmt(f.value)} ${f.unit}`).join('; ')}`)
          .join('. ')}.`,
    );
  if (plan.organic)
    out.push(
      `Organic soil (${fmt(plan.organic.fraction * 100)}% of the area): counted with drained-organic-soil emission ` +
        `factors (t C/ha for each year drained), assuming the land is drained under both the current and the ` +
        `proposed use, over the ${req.transitionYears}-year horizon; emissions continue for as long as it stays ` +
        `drained. If the land is not drained today the emission is understated. N2O from drained organic soils ` +
        `(EF2) is not counted: Tier 1 gives cropland and grassland the same EF2.`,
    );
  if (plan.setAsideRule)
    out.push(
      'Annual cropland converted to grassland: the set-aside F_LU (Table 5.5) is used for the transition period, ' +
        'as IPCC good practice asks until the land counts as grassland remaining grassland; any further gain after that is not credited.',
    );
  if (req.biomass && req.before.landUse === req.after.landUse)
    out.push(
      'Biomass: no change is counted within one land-use category at Tier 1 (only conversions between grassland and cropland change biomass here).',
    );
  if (!req.biomass) out.push("Biomass carbon was left out at the request's choice.");
  if (!req.n2o) out.push("N2O from mineralised nitrogen was left out at the request's choice.");
  if (plan.n2o && !plan.n2o.leach)
    out.push(
      'Dry climate: indirect N2O from leaching is not counted (Frac_LEACH applies only where leaching occurs); if ' +
        'the land is irrigated, leaching should be added.',
    );
  if (
    (req.after.landUse === 'cropland' && req.after.system === 'paddy-rice') ||
    (req.before.landUse === 'cropland' && req.before.system === 'paddy-rice')
  )
    out.push(
      'Paddy rice: tillage and input factors are not used for paddy rice (Table 5.5), so the tillage and input given for it have no effect.',
    );
  if (req.climate === 'tropical-montane' && plan.n2o)
    out.push(
      'Tropical montane has no moisture class in the IPCC scheme; it is treated as wet for N2O (leaching counted).',
    );
  if (
    regimeFor(req.climate).factorRegime === 'tropical-montane' &&
    plan.mineral.length > 0 &&
    req.factorSet !== 'ipcc-2019'
  )
    out.push(
      'Tropical montane reference stocks are low-confidence values: the row may not exist in the published table.',
    );
  return out;
}
