/**
 * What a recorded land-use event may say (pure): the kinds, the values each kind accepts, and
 * the checks the service and the form share. Dates are "YYYY-MM-DD"; `today` is passed in.
 */
import type { LandUseEventKind } from './land-use-history';

export const EVENT_KINDS = [
  'land-use',
  'management',
  'tillage',
  'reseeding',
] as const satisfies readonly LandUseEventKind[];

export const EVENT_KIND_LABELS: Record<LandUseEventKind, string> = {
  'land-use': 'Land use',
  management: 'Management',
  tillage: 'Tillage',
  reseeding: 'Reseeding',
};

/** Earliest date an event may carry; older claims are not evidence a screening can use. */
export const EARLIEST_EVENT_DATE = '1900-01-01';

/** Value → label per kind. Land uses in DEFAULT_GRASSLAND_USES (land-use-history.ts) count as grassland for the flags. */
export const EVENT_VALUES: Record<LandUseEventKind, Record<string, string>> = {
  'land-use': {
    grassland: 'Grassland',
    'temporary-grassland': 'Temporary grassland (ley)',
    meadow: 'Meadow',
    pasture: 'Pasture',
    'rough-grazing': 'Rough grazing',
    arable: 'Arable',
    fallow: 'Fallow',
    woodland: 'Woodland',
  },
  management: {
    grazed: 'Grazed',
    'cut-for-silage': 'Cut for silage',
    hay: 'Cut for hay',
    mixed: 'Grazed and cut',
    ungrazed: 'Left ungrazed',
    cropped: 'Cropped',
    lime: 'Limed (counts as cultivation)',
    fertiliser: 'Fertiliser spread (counts as cultivation)',
  },
  tillage: {
    ploughing: 'Ploughing',
    discing: 'Discing',
    harrowing: 'Harrowing',
    rotavating: 'Rotavating',
    subsoiling: 'Subsoiling',
  },
  reseeding: { 'full-reseed': 'Full reseed', overseeding: 'Overseeding', 'slot-seeding': 'Slot seeding' },
};

/** Management that counts as (chemical) cultivation for the uncultivated flag; see land-use-history.ts. */
export const CULTIVATING_MANAGEMENT = ['lime', 'fertiliser'];

/** Kinds whose value may be left out (uploads often give only the date of the last tillage or reseeding). */
export const VALUE_OPTIONAL: LandUseEventKind[] = ['tillage', 'reseeding'];

export type EventInput = { date: string; kind: LandUseEventKind; value?: string | null; evidence: string };
export type EventIssue = { path: ['date' | 'kind' | 'value' | 'evidence']; message: string };

/** Every problem with an event, each naming its field; empty when it may be recorded. */
export function checkLandUseEvent(e: EventInput, today: string): EventIssue[] {
  const issues: EventIssue[] = [];
  if (e.date.trim() === '') issues.push({ path: ['date'], message: 'Give the date of the event.' });
  else if (!/^\d{4}-\d{2}-\d{2}$/.test(e.date))
    issues.push({ path: ['date'], message: 'Use a date in the form YYYY-MM-DD.' });
  else if (e.date > today) issues.push({ path: ['date'], message: `The date lies in the future (today is ${today}).` });
  else if (e.date < EARLIEST_EVENT_DATE)
    issues.push({
      path: ['date'],
      message: `The date lies before ${EARLIEST_EVENT_DATE.slice(0, 4)}; give a date from 1900 on.`,
    });
  const choices = EVENT_VALUES[e.kind];
  const value = e.value?.trim() ?? '';
  if (!choices) issues.push({ path: ['kind'], message: `Choose one of: ${EVENT_KINDS.join(', ')}.` });
  else if (value === '' && !VALUE_OPTIONAL.includes(e.kind))
    issues.push({ path: ['value'], message: `Choose the ${EVENT_KIND_LABELS[e.kind].toLowerCase()}.` });
  else if (value !== '' && !Object.hasOwn(choices, value))
    issues.push({
      path: ['value'],
      message: `"${value}" is not a ${EVENT_KIND_LABELS[e.kind].toLowerCase()} value; choose one of: ${Object.keys(choices).join(', ')}.`,
    });
  if (e.evidence.trim().length < 3)
    issues.push({ path: ['evidence'], message: 'Say where this comes from (at least 3 characters).' });
  return issues;
}

/**
 * The stored `cultivation` mark: only management events carry it (tillage and reseeding always count
 * as cultivation in land-use-history.ts); chemical management (lime, fertiliser) is marked whatever was sent.
 */
export function cultivationMark(kind: LandUseEventKind, value: string | null, marked: boolean): boolean {
  return kind === 'management' && (marked || (value !== null && CULTIVATING_MANAGEMENT.includes(value)));
}
