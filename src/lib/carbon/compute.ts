import { C_TO_CO2, N2O_N_TO_N2O } from './constants';
import type { Plan } from './plan';

/** Reads a factor value by key: the set's value for the point estimate, a draw in Monte Carlo. */
export type ValueOf = (key: string) => number;

/** Figures of one calculation. Carbon in t C, N2O in t N2O, CO2e in t CO2e (positive = emission). */
export interface Figures {
  /** Mineral-soil equilibrium stocks, t C/ha of mineral soil (0 when the area is all organic). */
  socBeforePerHa: number;
  socAfterPerHa: number;
  /** Mineral-soil stock change over the area, t C (reached after D years). */
  mineralChangeTotal: number;
  /** Drained-organic-soil carbon change per year over the area, t C/yr (negative = loss). */
  organicAnnual: number;
  socChangeTotal: number;
  annualSocChange: number;
  biomassChangeTotal: number;
  n2oTotal: number;
  co2eParts: { soil: number; biomass: number; n2o: number };
  co2eTotal: number;
}

const product = (keys: string[], v: ValueOf) => keys.reduce((p, k) => p * v(k), 1);

/**
 * The method of issue 3, for an area `areaHa` and transition period `years` (D):
 * - Mineral soils, 2006 Vol 4 Ch 2 Eq 2.25: SOC = SOC_REF x F_LU x F_MG x F_I per soil
 *   fraction, area-weighted; the change (SOC_after - SOC_before) is reached linearly over D.
 * - Drained organic soils, 2006 Vol 4 Ch 5 Table 5.6 / Ch 6 Table 6.3: both land uses taken
 *   as drained; the change is (EF_after - EF_before) t C/ha for each year, counted over D years.
 * - Biomass, 2006 Vol 4 Ch 2 Eq 2.16: (B_after - B_before) x area, once, at conversion.
 * - N2O, 2006 Vol 4 Ch 11 Eq 11.8 with Eq 11.1 (EF1) and Eq 11.10 (Frac_LEACH x EF5):
 *   only when mineral soil carbon is lost; N = C lost / R; N2O = N x (EF1 + Frac_LEACH x EF5) x 44/28.
 * - CO2e: carbon x 44/12 (sign flipped: a loss is an emission); N2O x GWP.
 */
export function computeFigures(plan: Plan, areaHa: number, years: number, v: ValueOf): Figures {
  const mineralShare = plan.mineral.reduce((s, m) => s + m.fraction, 0);
  const fBefore = product(plan.beforeStockKeys, v);
  const fAfter = product(plan.afterStockKeys, v);
  let weightedBefore = 0;
  let weightedAfter = 0;
  for (const m of plan.mineral) {
    const ref = v(m.socRefKey);
    weightedBefore += m.fraction * ref * fBefore;
    weightedAfter += m.fraction * ref * fAfter;
  }
  const socBeforePerHa = mineralShare > 0 ? weightedBefore / mineralShare : 0;
  const socAfterPerHa = mineralShare > 0 ? weightedAfter / mineralShare : 0;
  const mineralChangeTotal = (weightedAfter - weightedBefore) * areaHa;

  const organicAnnual = plan.organic
    ? -(v(plan.organic.efAfterKey) - v(plan.organic.efBeforeKey)) * plan.organic.fraction * areaHa
    : 0;
  const socChangeTotal = mineralChangeTotal + organicAnnual * years;
  const annualSocChange = socChangeTotal / years;

  const biomassChangeTotal = plan.biomass
    ? (product(plan.biomass.afterKeys, v) - product(plan.biomass.beforeKeys, v)) * areaHa
    : 0;

  let n2oTotal = 0;
  if (plan.n2o && mineralChangeTotal < 0) {
    const nMineralised = -mineralChangeTotal / v(plan.n2o.cnKey); // t N
    const leach = plan.n2o.leach ? v(plan.n2o.leach.fracKey) * v(plan.n2o.leach.ef5Key) : 0;
    n2oTotal = nMineralised * (v(plan.n2o.ef1Key) + leach) * N2O_N_TO_N2O;
  }

  const co2eParts = {
    soil: -socChangeTotal * C_TO_CO2,
    biomass: -biomassChangeTotal * C_TO_CO2,
    n2o: plan.gwpN2oKey ? n2oTotal * v(plan.gwpN2oKey) : 0,
  };
  const co2eTotal = co2eParts.soil + co2eParts.biomass + co2eParts.n2o;
  return {
    socBeforePerHa,
    socAfterPerHa,
    mineralChangeTotal,
    organicAnnual,
    socChangeTotal,
    annualSocChange,
    biomassChangeTotal,
    n2oTotal,
    co2eParts,
    co2eTotal,
  };
}

/** Extra years shown after the transition in the trajectory. */
export const TRAJECTORY_TAIL_YEARS = 10;

/**
 * Year-by-year path, year 0 = before the change, to D + 10. Mineral SOC and the N2O it
 * causes move linearly for D years, then stop; biomass changes once in year 1; drained
 * organic soils keep emitting every year they stay drained, so the cumulative CO2e keeps
 * rising after D when organic soil is present. At year D the cumulative CO2e equals co2eTotal.
 */
export function buildTrajectory(
  f: Figures,
  years: number,
): { year: number; socPerHa: number; co2eCumulative: number }[] {
  const out: { year: number; socPerHa: number; co2eCumulative: number }[] = [];
  for (let year = 0; year <= years + TRAJECTORY_TAIL_YEARS; year++) {
    const share = Math.min(year, years) / years;
    const soil = -(f.mineralChangeTotal * share + f.organicAnnual * year) * C_TO_CO2;
    const co2eCumulative = soil + (year >= 1 ? f.co2eParts.biomass : 0) + f.co2eParts.n2o * share;
    out.push({ year, socPerHa: f.socBeforePerHa + (f.socAfterPerHa - f.socBeforePerHa) * share, co2eCumulative });
  }
  return out;
}
