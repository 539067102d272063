/**
 * The dashboard's figures (pure): grassland converted and restored per year, the carbon budget
 * left, and each accounting region's headroom under the permanent-grassland ratio rule.
 *
 * The ratio rule: the ratio of permanent grassland to agricultural area may not fall by more than
 * a share (5 % in the shipped rule set) below the region's reference ratio. The region may lose
 * permanent grassland until ratio = reference × (1 − allowed fall), so the headroom in hectares is
 * permanent grassland − conversions approved but not yet in the land-use record − that limit
 * ratio × agricultural area (converted land stays agricultural, so the area is unchanged).
 */

const GRASS = new Set(['grassland', 'meadow', 'pasture']);
const isGrass = (landUse: string | null) => landUse !== null && GRASS.has(landUse.trim().toLowerCase());

export type ChangeKind = 'conversion' | 'restoration' | 'other';

/**
 * What an approved change does to grassland: grassland (or unknown) to a non-grass use is a
 * conversion; a non-grass use to grassland a restoration; anything else (a sward improved,
 * cropland kept as cropland) neither.
 */
export function classifyChange(priorLandUse: string | null, proposedLandUse: string): ChangeKind {
  const after = isGrass(proposedLandUse);
  if (!after && (priorLandUse === null || isGrass(priorLandUse))) return 'conversion';
  if (after && priorLandUse !== null && !isGrass(priorLandUse)) return 'restoration';
  return 'other';
}

/**
 * An approved conversion still to come off the region's figures: the land-use record shows no
 * non-grass use on the parcel since the decision (once it does, the figures already carry it).
 */
export function conversionPending(p: {
  priorLandUse: string | null;
  proposedLandUse: string;
  laterLandUse: string | null;
}): boolean {
  return (
    classifyChange(p.priorLandUse, p.proposedLandUse) === 'conversion' &&
    (p.laterLandUse === null || isGrass(p.laterLandUse))
  );
}

export type ApprovedParcel = { year: number; priorLandUse: string | null; proposedLandUse: string; areaHa: number };
export type YearChange = { year: number; convertedHa: number; restoredHa: number };

/** Hectares converted and restored by year of decision, every year from the first to `lastYear` (gaps as 0). */
export function changesByYear(parcels: ApprovedParcel[], lastYear: number): YearChange[] {
  const by = new Map<number, YearChange>();
  for (const p of parcels) {
    const kind = classifyChange(p.priorLandUse, p.proposedLandUse);
    if (kind === 'other') continue;
    const row = by.get(p.year) ?? { year: p.year, convertedHa: 0, restoredHa: 0 };
    if (kind === 'conversion') row.convertedHa += p.areaHa;
    else row.restoredHa += p.areaHa;
    by.set(p.year, row);
  }
  if (by.size === 0) return [];
  const first = Math.min(...by.keys());
  const out: YearChange[] = [];
  for (let y = first; y <= Math.max(lastYear, ...by.keys()); y++)
    out.push(by.get(y) ?? { year: y, convertedHa: 0, restoredHa: 0 });
  return out;
}

export type BudgetLeft = { budgetT: number | null; committedT: number; leftT: number | null; usedShare: number | null };

/** What is left of a year's CO2e budget after the committed approvals (negative when it is overspent). */
export function budgetLeft(budgetT: number | null, committedT: number): BudgetLeft {
  if (budgetT === null || budgetT <= 0) return { budgetT: null, committedT, leftT: null, usedShare: null };
  return { budgetT, committedT, leftT: budgetT - committedT, usedShare: committedT / budgetT };
}

export type HeadroomInput = {
  agriculturalHa: number;
  permanentGrasslandHa: number;
  referenceRatio: number | null;
  /** Largest allowed relative fall of the ratio (0.05 = 5 %); null when the rule set has no ratio rule. */
  maxRelativeFall: number | null;
  /** Conversions approved in the region but not yet in the land-use record, ha. */
  pendingConvertedHa: number;
};

export type Headroom = {
  ratioNow: number | null;
  ratioAfterPending: number | null;
  limitRatio: number | null;
  /** Hectares of permanent grassland that could still be converted before the ratio passes the limit (0 when past it); null when undecidable. */
  headroomHa: number | null;
  /** How far past the limit the region already is, ha (0 when within it). */
  shortfallHa: number;
};

export function regionHeadroom(r: HeadroomInput): Headroom {
  const agri = r.agriculturalHa;
  const ratioNow = agri > 0 ? r.permanentGrasslandHa / agri : null;
  const pgAfter = Math.max(0, r.permanentGrasslandHa - r.pendingConvertedHa);
  const ratioAfterPending = agri > 0 ? pgAfter / agri : null;
  if (agri <= 0 || r.referenceRatio === null || r.referenceRatio <= 0 || r.maxRelativeFall === null) {
    return { ratioNow, ratioAfterPending, limitRatio: null, headroomHa: null, shortfallHa: 0 };
  }
  const limitRatio = r.referenceRatio * (1 - r.maxRelativeFall);
  const room = pgAfter - limitRatio * agri;
  // Float noise below a square metre is not a shortfall.
  const clean = Math.abs(room) < 1e-4 ? 0 : room;
  return { ratioNow, ratioAfterPending, limitRatio, headroomHa: Math.max(0, clean), shortfallHa: Math.max(0, -clean) };
}

export type ConditionDue = { seq: number; reference: string; text: string; dueDate: string; checkedBy: string };

/** Conditions split into open (due today or later) and overdue (due date passed), soonest first. */
export function conditionsByDue(items: ConditionDue[], today: string) {
  const sorted = [...items].sort((a, b) => a.dueDate.localeCompare(b.dueDate) || a.seq - b.seq);
  return { open: sorted.filter((c) => c.dueDate >= today), overdue: sorted.filter((c) => c.dueDate < today) };
}

/** Whole days from `due` to `today` (both YYYY-MM-DD), positive when `today` is later. */
export function daysPast(due: string, today: string): number {
  return Math.round((Date.parse(`${today}T00:00:00Z`) - Date.parse(`${due}T00:00:00Z`)) / 86_400_000);
}
