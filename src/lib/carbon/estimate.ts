import { cautionsFor } from './cautions';
import { C_TO_CO2_FACTOR, N2O_N_TO_N2O_FACTOR } from './constants';
import { buildTrajectory, computeFigures } from './compute';
import { EstimateInputError } from './errors';
import type { FactorSetDocument } from './factor-set-schema';
import { runMonteCarlo } from './monte-carlo';
import { buildPlan } from './plan';
import { estimateRequestSchema, type EstimateRequest, type EstimateResult } from './schemas';
import type { UsedFactor } from './types';

export { EstimateInputError } from './errors';

/**
 * IPCC Tier 1 estimate of the soil-carbon, biomass and N2O consequences of changing the
 * use or management of one area, with values from ONE factor set.
 *
 * Throws EstimateInputError (issues naming the field) when the request does not parse,
 * when a value the request needs is marked not applicable (e.g. a soil class with no
 * reference stock in the region), or when the set lacks a value.
 */
export function estimateLandUseChange(input: EstimateRequest, set: FactorSetDocument): EstimateResult {
  const parsed = estimateRequestSchema.safeParse(input);
  if (!parsed.success)
    throw new EstimateInputError(
      parsed.error.issues.map((i) => ({
        path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)),
        message: i.message,
      })),
    );
  return estimateParsed(parsed.data, set, null);
}

/** What does not depend on the area: the plan, the factors used and the cautions (see estimateBatch). */
type Shape = { plan: ReturnType<typeof buildPlan>; factors: UsedFactor[]; cautions: string[] };

function shapeOf(req: EstimateRequest, set: FactorSetDocument): Shape {
  const plan = buildPlan(req, set);
  const factors: UsedFactor[] = [...plan.factors.values()].map(({ key, value, unit, source, status, role }) => ({
    key,
    value,
    unit,
    source,
    status,
    role,
  }));
  factors.push(C_TO_CO2_FACTOR);
  if (plan.n2o) factors.push(N2O_N_TO_N2O_FACTOR);
  return { plan, factors, cautions: cautionsFor(req, plan, factors) };
}

/** Names a parsed request's kind: every field but the area, as JSON (written field by field: a rest copy is slower). */
function shapeKey(req: EstimateRequest): string {
  let key = '';
  for (const k in req) if (k !== 'areaHa') key += `${k}:${JSON.stringify((req as Record<string, unknown>)[k])},`;
  return key;
}

function estimateParsed(req: EstimateRequest, set: FactorSetDocument, batch: Batch | null): EstimateResult {
  let shape: Shape;
  if (batch && !req.uncertainty) {
    const key = shapeKey(req);
    shape = batch.shapes.get(key) ?? batch.shapes.set(key, sharedShape(shapeOf(req, set), batch.lists)).get(key)!;
  } else shape = shapeOf(req, set);
  const { plan } = shape;
  const D = req.transitionYears;
  const figures = computeFigures(plan, req.areaHa, D, (k) => plan.factors.get(k)!.value);
  // In a batch, results of one kind share their (frozen) factors and cautions: thousands of parcels
  // then carry one copy, and a serialiser can write it once (see lib/http/shared-json.ts).
  const shared = batch !== null && !req.uncertainty;
  const factors = shape.factors;
  const cautions = shared ? shape.cautions : [...shape.cautions];
  let uncertainty: EstimateResult['uncertainty'];
  if (req.uncertainty) {
    const mc = runMonteCarlo(plan, req.areaHa, D, req.uncertainty.runs, req.uncertainty.seed);
    uncertainty = { co2eLow: mc.co2eLow, co2eHigh: mc.co2eHigh, runs: mc.runs, seed: mc.seed };
    cautions.push(...mc.cautions);
  }

  const result: EstimateResult = {
    socBeforePerHa: figures.socBeforePerHa,
    socAfterPerHa: figures.socAfterPerHa,
    socChangeTotal: figures.socChangeTotal,
    annualSocChange: figures.annualSocChange,
    biomassChangeTotal: figures.biomassChangeTotal,
    n2oTotal: figures.n2oTotal,
    co2eTotal: figures.co2eTotal,
    co2eParts: figures.co2eParts,
    trajectory: buildTrajectory(figures, D),
    factors,
    factorSet: { id: set.id, version: set.version },
    ...(uncertainty ? { uncertainty } : {}),
    cautions,
  };
  if (shared) {
    // The shared factors and cautions were checked once (sharedShape).
    for (const k in result)
      if (k !== 'factors' && k !== 'cautions') assertAllFinite(result[k as keyof EstimateResult], `result.${k}`);
  } else assertAllFinite(result);
  return result;
}

/** What a batch keeps: the shape of each kind of request, and each distinct factors or cautions list once. */
type Batch = { shapes: Map<string, Shape>; lists: Map<string, readonly unknown[]> };

/**
 * A batch's shape: factors and cautions checked once and frozen, as every result of its kind shares them.
 * Kinds that differ only in their soil fractions mostly use the same factors and cautions: equal lists
 * are kept once (`lists`, by their JSON), so results share them and a serialiser writes each once.
 */
function sharedShape(shape: Shape, lists: Batch['lists']): Shape {
  const once = <T>(list: T[], check: boolean): T[] => {
    const key = JSON.stringify(list);
    const known = lists.get(key);
    if (known) return known as T[];
    if (check) assertAllFinite(list, 'result.factors');
    for (const f of list) if (typeof f === 'object' && f !== null) Object.freeze(f);
    lists.set(key, Object.freeze(list));
    return list;
  };
  return { ...shape, factors: once(shape.factors, true), cautions: once(shape.cautions, false) };
}

/**
 * Many estimates with one factor set: the same results as estimateLandUseChange for each
 * request, computed with one plan per kind of request (everything but the area), which is
 * what makes thousands of parcels cheap. Requests are parsed like the single estimate; a request
 * written like one parsed before except for its area (a positive finite number, all the schema asks
 * of it) takes that parse with its own area.
 */
export function estimateBatch(inputs: EstimateRequest[], set: FactorSetDocument): EstimateResult[] {
  const batch: Batch = { shapes: new Map(), lists: new Map() };
  const parsedByKind = new Map<string, EstimateRequest>();
  return inputs.map((input) => {
    const areaHa: unknown = input.areaHa;
    const key = typeof areaHa === 'number' && Number.isFinite(areaHa) && areaHa > 0 ? shapeKey(input) : null;
    const known = key === null ? undefined : parsedByKind.get(key);
    if (known) return estimateParsed({ ...known, areaHa: areaHa as number }, set, batch);
    const parsed = estimateRequestSchema.safeParse(input);
    if (!parsed.success)
      throw new EstimateInputError(
        parsed.error.issues.map((i) => ({
          path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)),
          message: i.message,
        })),
      );
    if (key !== null) parsedByKind.set(key, parsed.data);
    return estimateParsed(parsed.data, set, batch);
  });
}

/** Whether a value holds only finite numbers and no null or undefined (the check of assertAllFinite, without paths). */
function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (value === null || value === undefined) return false;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) if (!allFinite(value[i])) return false;
    return true;
  }
  if (typeof value === 'object') {
    for (const k in value)
      if (Object.hasOwn(value, k) && !allFinite((value as Record<string, unknown>)[k])) return false;
  }
  return true;
}

/**
 * Guards the promise of the API: never NaN, Infinity, null or undefined in a result. The path of
 * the first bad value is worked out only when there is one (thousands of results a second pass).
 */
export function assertAllFinite(value: unknown, path = 'result'): void {
  if (!allFinite(value)) findNotFinite(value, path);
}

function findNotFinite(value: unknown, path: string): void {
  if (value === null || value === undefined) throw new Error(`${path} is ${value}`);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`${path} is not a finite number (${value})`);
    return;
  }
  if (Array.isArray(value)) return value.forEach((v, i) => findNotFinite(v, `${path}[${i}]`));
  if (typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) findNotFinite(v, `${path}.${k}`);
  }
}
