import { regimeFor, type ClimateRegime } from './climate-regimes';
import { EstimateInputError } from './errors';
import type { FactorSetDocument } from './factor-set-schema';
import { Resolver, type PlanFactor } from './resolver';
import type { EstimateRequest } from './schemas';
import type { CroplandState, LandUseState, MineralSoilType } from './types';

/**
 * A calculation plan: which factor keys feed which term. The arithmetic (compute.ts) reads
 * values through a lookup, so the point estimate and every Monte Carlo run share one formula.
 */
export interface Plan {
  factors: Map<string, PlanFactor>;
  /** Mineral soil fractions and their SOC_REF key (Table 2.3). */
  mineral: { type: MineralSoilType; fraction: number; socRefKey: string }[];
  /** Stock change factor keys multiplied onto SOC_REF (Eq 2.25): before and after the change. */
  beforeStockKeys: string[];
  afterStockKeys: string[];
  /** Drained organic soil (Tables 5.6 / 6.3), t C/ha/yr for each year drained. */
  organic: { fraction: number; efBeforeKey: string; efAfterKey: string } | null;
  /** Biomass stocks in t C/ha as products of keys; null when off or no land-use category change. */
  biomass: { beforeKeys: string[]; afterKeys: string[] } | null;
  /** N2O from mineralisation (Ch 11 Eq 11.8); `leach` null where no leaching occurs. */
  n2o: { cnKey: string; ef1Key: string; leach: { fracKey: string; ef5Key: string } | null } | null;
  /** GWP-100 of N2O; null when N2O is not estimated. */
  gwpN2oKey: string | null;
  /** Annual cropland converted to grassland: set-aside F_LU used for the transition (Ch 6 §6.3.3.1). */
  setAsideRule: boolean;
}

const ANNUAL: readonly CroplandState['system'][] = ['long-term-cultivated', 'paddy-rice', 'set-aside'];

function stockKeys(
  res: Resolver,
  st: LandUseState,
  side: 'before' | 'after',
  cr: ClimateRegime,
  climate: string,
  setAside: boolean,
): string[] {
  const g = cr.factorRegime;
  const na = (what: string) => `No ${what} for climate region "${climate}"`;
  if (st.landUse === 'cropland') {
    // 2006 Vol 4 Ch 5 Table 5.5 (7th Corrigendum: land converted to cropland ends on Table 5.5 factors).
    const t = 'cropland-stock-factors';
    const keys = [
      res.use(
        t,
        `f-lu/${st.system}/${g}`,
        `F_LU ${side} (${st.system})`,
        [side, 'system'],
        na(`cropland F_LU for "${st.system}"`),
      ),
    ];
    if (st.system === 'paddy-rice') return keys; // Table 5.5: F_MG and F_I are not used for paddy rice.
    keys.push(
      res.use(
        t,
        `f-mg/${st.tillage}/${g}`,
        `F_MG ${side} (tillage ${st.tillage})`,
        [side, 'tillage'],
        na(`cropland F_MG for tillage "${st.tillage}"`),
      ),
    );
    keys.push(
      res.use(
        t,
        `f-i/${st.input}/${g}`,
        `F_I ${side} (input ${st.input})`,
        [side, 'input'],
        na(`cropland F_I for input "${st.input}"`),
      ),
    );
    return keys;
  }
  // 2006 Vol 4 Ch 6 Table 6.2. Annual cropland converted to grassland uses the set-aside
  // F_LU of Table 5.5 for the transition (2006 Vol 4 Ch 6 §6.3.3.1, read in S3).
  const t = 'grassland-stock-factors';
  const fLu = setAside
    ? res.use(
        'cropland-stock-factors',
        `f-lu/set-aside/${g}`,
        `F_LU ${side} (set-aside F_LU for annual cropland converted to grassland)`,
        [side, 'landUse'],
        na('set-aside F_LU'),
      )
    : res.use(
        t,
        `f-lu/all-permanent/${g}`,
        `F_LU ${side} (permanent grassland)`,
        [side, 'landUse'],
        na('grassland F_LU'),
      );
  return [
    fLu,
    res.use(
      t,
      `f-mg/${st.management}/${g}`,
      `F_MG ${side} (${st.management})`,
      [side, 'management'],
      na(`grassland F_MG for "${st.management}"`),
    ),
    res.use(
      t,
      `f-i/${st.input}/${g}`,
      `F_I ${side} (input ${st.input})`,
      [side, 'input'],
      na(`grassland F_I for input "${st.input}"`),
    ),
  ];
}

function biomassKeys(
  res: Resolver,
  st: LandUseState,
  side: 'before' | 'after',
  cr: ClimateRegime,
  climate: string,
): string[] {
  const na = (what: string) =>
    `No default ${what} for climate region "${climate}"; set biomass to false to estimate without it`;
  if (st.landUse === 'grassland') {
    // 2006 Vol 4 Ch 6 Table 6.4, total non-woody (above + below ground), t d.m./ha, x carbon fraction.
    return [
      res.use(
        'grassland-biomass',
        `total/${cr.grassBiomassRow}`,
        `grassland biomass ${side} (total above + below ground)`,
        ['biomass'],
        na('grassland biomass (Table 6.4)'),
      ),
      res.use(
        'carbon-fraction',
        'herbaceous',
        'carbon fraction of grassland dry matter',
        ['biomass'],
        na('carbon fraction'),
      ),
    ];
  }
  // 2006 Vol 4 Ch 5 Table 5.9, t C/ha in the year following conversion. Paddy rice and
  // set-aside are annual cropland in Table 5.5, so they take the annual value (engine choice).
  const entry = st.system === 'perennial' ? `perennial/${cr.cropBiomassRow}` : 'annual/all';
  return [
    res.use(
      'cropland-biomass',
      entry,
      `cropland biomass ${side} (${st.system === 'perennial' ? 'perennial' : 'annual'})`,
      ['biomass'],
      na(`${st.system} cropland biomass (Table 5.9)`),
    ),
  ];
}

/** Resolves every factor the request needs from one set; throws EstimateInputError listing all problems. */
export function buildPlan(req: EstimateRequest, set: FactorSetDocument): Plan {
  const res = new Resolver(set);
  if (req.factorSet !== undefined && req.factorSet !== set.id)
    res.issues.push({
      path: ['factorSet'],
      message: `The request names factor set "${req.factorSet}" but "${set.id}" was supplied; sets are never mixed.`,
    });
  const cr = regimeFor(req.climate);
  const { before, after, climate } = req;
  const setAsideRule = before.landUse === 'cropland' && ANNUAL.includes(before.system) && after.landUse === 'grassland';

  const mineral: Plan['mineral'] = [];
  let organic: Plan['organic'] = null;
  req.soils.forEach((s, i) => {
    if (s.type === 'organic') {
      const lu = (st: LandUseState, side: string) =>
        res.use(
          'organic-soil-ef',
          `${st.landUse}/${cr.organicRow}`,
          `drained organic soil EF ${side} (${st.landUse})`,
          ['soils', i, 'type'],
          `No drained-organic-soil emission factor for ${st.landUse} in climate region "${climate}"`,
        );
      organic = { fraction: s.fraction, efBeforeKey: lu(before, 'before'), efAfterKey: lu(after, 'after') };
    } else {
      const socRefKey = res.use(
        'soc-ref',
        `${cr.socRefRow}/${s.type}`,
        `SOC_REF for ${s.type}`,
        ['soils', i, 'type'],
        `Soil class "${s.type}" has no reference stock (SOC_REF) in climate region "${climate}"`,
      );
      mineral.push({ type: s.type, fraction: s.fraction, socRefKey });
    }
  });

  const hasMineral = mineral.length > 0;
  const beforeStockKeys = hasMineral ? stockKeys(res, before, 'before', cr, climate, false) : [];
  const afterStockKeys = hasMineral ? stockKeys(res, after, 'after', cr, climate, setAsideRule) : [];

  // Tier 1: biomass changes only when the land-use category changes (Vol 4 Ch 2 Eq 2.16).
  const biomass =
    req.biomass && before.landUse !== after.landUse
      ? {
          beforeKeys: biomassKeys(res, before, 'before', cr, climate),
          afterKeys: biomassKeys(res, after, 'after', cr, climate),
        }
      : null;

  let n2o: Plan['n2o'] = null;
  if (req.n2o && hasMineral) {
    const t = 'n2o-mineralisation';
    const naN = (what: string) => `No ${what} in this factor set; set n2o to false to estimate without it`;
    // Eq 11.8 text: R = 15 for land-use change from grassland; 10 for management change on
    // cropland remaining cropland. Grassland management change also takes 15 (engine choice).
    const cn = before.landUse === 'grassland' ? 'cn-ratio/land-use-change' : 'cn-ratio/cropland-management';
    const ef1 =
      after.landUse === 'cropland' && after.system === 'paddy-rice' ? 'ef1/flooded-rice' : `ef1/${cr.n2oMoisture}`;
    n2o = {
      cnKey: res.use(t, cn, 'C:N ratio of soil organic matter (R)', ['n2o'], naN('C:N ratio')),
      ef1Key: res.use(t, ef1, 'EF1, direct N2O from mineralised N', ['n2o'], naN('EF1')),
      leach:
        cr.n2oMoisture === 'wet'
          ? {
              fracKey: res.use(t, 'frac-leach', 'Frac_LEACH, share of N leached', ['n2o'], naN('Frac_LEACH')),
              ef5Key: res.use(t, 'ef5', 'EF5, N2O from leached N', ['n2o'], naN('EF5')),
            }
          : null,
    };
  }
  const gwpN2oKey = n2o
    ? res.use(
        'gwp',
        `${req.gwp}/n2o`,
        `GWP-100 of N2O (${req.gwp.toUpperCase()})`,
        ['gwp'],
        `No N2O GWP for ${req.gwp}`,
      )
    : null;

  if (res.issues.length > 0) throw new EstimateInputError(res.issues);
  return {
    factors: res.factors,
    mineral,
    beforeStockKeys,
    afterStockKeys,
    organic,
    biomass,
    n2o,
    gwpN2oKey,
    setAsideRule,
  };
}
