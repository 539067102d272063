/**
 * Folding many areas into one calculation per kind of change (pure).
 *
 * For one climate region, before state and after state, every stock-change, biomass and N2O
 * factor is the same for every area, so the method of compute.ts is linear in (area x soil
 * fraction) for each soil class: mineral SOC change = sum of area x fraction x SOC_REF x
 * (F_after - F_before); drained organic soil = area x fraction x EF difference x years; biomass
 * = area x stock difference; and N2O follows the mineral loss, whose sign is the sign of
 * (F_after - F_before), the same for every area of the group. So the sum of the areas' figures
 * equals the figures of ONE request with the summed area and area-weighted soil fractions, for
 * the point estimate and for every Monte Carlo draw. This lets a proposal of thousands of
 * parcels, and every alternative, run its joint range over a handful of calculations.
 */
import type { EstimateRequest } from './schemas';

/**
 * The same text for the same content whatever the key order (keys sorted, undefined left out,
 * values as JSON.stringify writes them), a few times faster than a full RFC 8785 canonical form,
 * which only a hash needs; here it only groups requests.
 */
function groupKey(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  if (Array.isArray(v)) return `[${v.map(groupKey).join(',')}]`;
  const o = v as Record<string, unknown>;
  let s = '{';
  for (const k of Object.keys(o).sort()) if (o[k] !== undefined) s += `${JSON.stringify(k)}:${groupKey(o[k])},`;
  return `${s}}`;
}

/** The text that names a request's group: requests with the same key merge (all but soils, area and uncertainty). */
export function linearGroupKey(r: EstimateRequest): string {
  const o = r as Record<string, unknown>;
  let s = '{';
  for (const k of Object.keys(o).sort())
    if (o[k] !== undefined && k !== 'soils' && k !== 'areaHa' && k !== 'uncertainty')
      s += `${JSON.stringify(k)}:${groupKey(o[k])},`;
  return `${s}}`;
}

/**
 * `keys` (optional): each request's `linearGroupKey`, when the caller already knows them (an assessment
 * merges the same parcels for every alternative); the result is the same as without them.
 */
export function mergeLinearRequests(requests: EstimateRequest[], keys?: readonly string[]): EstimateRequest[] {
  if (keys && keys.length !== requests.length) throw new Error('mergeLinearRequests: one key per request');
  const groups = new Map<string, { req: EstimateRequest; areaHa: number; soilHa: Map<string, number> }>();
  for (let i = 0; i < requests.length; i++) {
    const r = requests[i]!;
    const key = keys ? keys[i]! : linearGroupKey(r);
    const g = groups.get(key) ?? { req: r, areaHa: 0, soilHa: new Map<string, number>() };
    g.areaHa += r.areaHa;
    for (const s of r.soils) g.soilHa.set(s.type, (g.soilHa.get(s.type) ?? 0) + s.fraction * r.areaHa);
    groups.set(key, g);
  }
  return [...groups.values()].map((g) => {
    const types = [...g.soilHa.keys()].sort();
    const soils = types.map((type) => ({ type, fraction: g.soilHa.get(type)! / g.areaHa })) as EstimateRequest['soils'];
    // Make the fractions sum to 1 exactly, whatever the rounding of the division.
    const rest = soils.slice(0, -1).reduce((s, x) => s + x.fraction, 0);
    soils[soils.length - 1]!.fraction = 1 - rest;
    return { ...g.req, soils, areaHa: g.areaHa };
  });
}
