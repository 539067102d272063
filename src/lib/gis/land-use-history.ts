/**
 * Derives a parcel's status flags from its dated land-use history (pure; `asOf` is passed in).
 * - Permanent grassland: grassland not in the crop rotation for >= N years (default 5),
 *   Regulation (EU) 2021/2115 Art. 4(3)(c); Member States may also count ploughing, tillage
 *   or reseeding as ending the spell (option `tillageEndsGrassland`).
 * - Uncultivated: no cultivation in the last M years (default 15), as in the guidance to the
 *   Environmental Impact Assessment (Agriculture) (England) (No. 2) Regulations 2006; that
 *   guidance counts physical (ploughing, harrowing, reseeding) and chemical (fertiliser, lime)
 *   cultivation (from memory), so events flagged `cultivation: true` count too.
 * - Never tilled: no tillage and no arable use anywhere in the recorded history.
 * A flag is null when the history is too short to decide; every flag carries a plain reason.
 */
import { formatDate } from '../format/dates';

export type LandUseEventKind = 'land-use' | 'management' | 'tillage' | 'reseeding';

export interface LandUseEvent {
  /** Calendar date "YYYY-MM-DD". */
  date: string;
  kind: LandUseEventKind;
  /** For land-use events the use (e.g. "grassland", "arable"); for others a free description. */
  value?: string | null;
  /** Marks a management event as cultivation (e.g. liming, fertiliser). Tillage and reseeding always are. */
  cultivation?: boolean;
}

export interface LandUseFlagOptions {
  /** Date the flags are derived for, "YYYY-MM-DD". */
  asOf: string;
  /** Years out of rotation for permanent grassland. Default 5 (EU 2021/2115 Art. 4(3)(c)). */
  permanentGrasslandYears?: number;
  /** Look-back window for "uncultivated", years. Default 15 (England EIA screening guidance). */
  uncultivatedYears?: number;
  /** Land-use values that count as grassland. */
  grasslandUses?: string[];
  /** Member-State option: tillage or reseeding also restarts the grassland count. Default false. */
  tillageEndsGrassland?: boolean;
  /** Date records begin, "YYYY-MM-DD"; default the earliest event. */
  historyStart?: string | null;
}

export interface StatusFlag {
  value: boolean | null;
  reason: string;
}

export interface LandUseFlags {
  currentLandUse: string | null;
  permanentGrassland: StatusFlag;
  uncultivated: StatusFlag;
  neverTilled: StatusFlag;
}

export const DEFAULT_GRASSLAND_USES = ['grassland', 'temporary-grassland', 'meadow', 'pasture', 'rough-grazing'];

/**
 * Dates already found valid and earlier results of yearsBefore: a screening run checks the same
 * few dates for tens of thousands of parcels. Both are fixed facts of the calendar (bounded memo).
 */
const MEMO_MAX = 50_000;
const validDates = new Set<string>();
const earlier = new Map<string, string>();

function checkDate(date: string, what: string): string {
  if (validDates.has(date)) return date;
  const d = new Date(`${date}T00:00:00Z`);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(date) || Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== date) {
    throw new RangeError(`${what} "${date}" is not a calendar date in the form YYYY-MM-DD.`);
  }
  if (validDates.size < MEMO_MAX) validDates.add(date);
  return date;
}

/** The same calendar day `years` earlier (29 February → 28 February). ISO strings compare as dates. */
export function yearsBefore(date: string, years: number): string {
  const key = `${date}|${years}`;
  const known = earlier.get(key);
  if (known !== undefined) return known;
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const t = new Date(Date.UTC(y - years, m - 1, d));
  if (t.getUTCMonth() !== m - 1) t.setUTCDate(0);
  const out = t.toISOString().slice(0, 10);
  if (earlier.size < MEMO_MAX) earlier.set(key, out);
  return out;
}

const isCultivation = (e: LandUseEvent) => e.kind === 'tillage' || e.kind === 'reseeding' || e.cultivation === true;

export function deriveLandUseFlags(events: LandUseEvent[], options: LandUseFlagOptions): LandUseFlags {
  const asOf = checkDate(options.asOf, 'asOf');
  events.forEach((e, i) => checkDate(e.date, `Event ${i + 1} date`));
  const history = events.filter((e) => e.date <= asOf).sort((a, b) => a.date.localeCompare(b.date));
  const start = options.historyStart ? checkDate(options.historyStart, 'historyStart') : (history[0]?.date ?? null);
  const grass = new Set(options.grasslandUses ?? DEFAULT_GRASSLAND_USES);
  const uses = history.filter((e) => e.kind === 'land-use' && e.value);
  const current = uses.at(-1)?.value ?? null;
  return {
    currentLandUse: current,
    permanentGrassland: permanentGrassland(history, uses, grass, asOf, options),
    uncultivated: uncultivated(history, start, asOf, options.uncultivatedYears ?? 15),
    neverTilled: neverTilled(history, uses, grass, start),
  };
}

function permanentGrassland(
  history: LandUseEvent[],
  uses: LandUseEvent[],
  grass: Set<string>,
  asOf: string,
  o: LandUseFlagOptions,
): StatusFlag {
  const years = o.permanentGrasslandYears ?? 5;
  const current = uses.at(-1);
  if (!current) return { value: null, reason: 'No land use is recorded, so permanent grassland cannot be decided.' };
  if (!grass.has(current.value!))
    return {
      value: false,
      reason: `The current land use is "${current.value}" (since ${formatDate(current.date)}), not grassland.`,
    };
  const lastOther = uses.findLast((e) => !grass.has(e.value!));
  const spellStart = lastOther ? uses.find((e) => e.date > lastOther.date)!.date : uses[0]!.date;
  let since = spellStart;
  let cause = lastOther ? `after "${lastOther.value}" in ${formatDate(lastOther.date)}` : 'with no other use recorded';
  const lastWork = o.tillageEndsGrassland
    ? history.findLast((e) => e.kind === 'tillage' || e.kind === 'reseeding')
    : undefined;
  if (lastWork && lastWork.date > since) {
    since = lastWork.date;
    cause = `since the ${lastWork.kind} of ${formatDate(lastWork.date)}`;
  }
  const threshold = yearsBefore(asOf, years);
  const long = since <= threshold;
  const qualifier = !lastOther && long ? ' at least' : '';
  return {
    value: long ? true : lastOther || lastWork ? false : null,
    reason: long
      ? `Grassland${qualifier} since ${formatDate(since)} (${cause}): out of the crop rotation for ${years} years or more on ${formatDate(asOf)}.`
      : lastOther || lastWork
        ? `Grassland only since ${formatDate(since)} (${cause}): less than ${years} years before ${formatDate(asOf)}.`
        : `Grassland recorded only since ${since}; the history is shorter than ${years} years, so permanence cannot be shown.`,
  };
}

function uncultivated(history: LandUseEvent[], start: string | null, asOf: string, years: number): StatusFlag {
  const windowStart = yearsBefore(asOf, years);
  const last = history.findLast(isCultivation);
  if (last && last.date > windowStart) {
    return {
      value: false,
      reason: `Cultivated on ${formatDate(last.date)} (${last.kind}${last.value ? `: ${last.value}` : ''}), within the last ${years} years.`,
    };
  }
  if (start === null || start > windowStart) {
    return {
      value: null,
      reason: `Records begin ${formatDate(start, 'nowhere')}, later than ${formatDate(windowStart)}: the ${years}-year window is not covered.`,
    };
  }
  const before = last ? ` (last cultivation ${last.date})` : '';
  return {
    value: true,
    reason: `No cultivation recorded between ${formatDate(windowStart)} and ${formatDate(asOf)}${before}.`,
  };
}

function neverTilled(
  history: LandUseEvent[],
  uses: LandUseEvent[],
  grass: Set<string>,
  start: string | null,
): StatusFlag {
  const tilled = history.find((e) => e.kind === 'tillage');
  if (tilled)
    return { value: false, reason: `Tilled on ${formatDate(tilled.date)}${tilled.value ? ` (${tilled.value})` : ''}.` };
  const arable = uses.find((e) => !grass.has(e.value!));
  if (arable)
    return {
      value: false,
      reason: `Used as "${arable.value}" from ${formatDate(arable.date)}, which implies tillage.`,
    };
  if (start === null) return { value: null, reason: 'No history is recorded.' };
  return { value: true, reason: `No tillage or arable use recorded since records began on ${formatDate(start)}.` };
}
