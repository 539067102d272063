/**
 * The attribute-mapping step: which source column feeds which Swardkeep field, and reading
 * one feature's values through it (pure). Bad values are reported per feature, never guessed.
 */
import { z } from 'zod';
import { AREA_UNITS, type AreaUnit } from './area-units';
import { EARLIEST_EVENT_DATE, EVENT_VALUES } from './land-use-events';
import { classProblem, REFERENCE_KINDS } from './reference-kinds';
import type { AttributeValue } from './types';
import type { ValidationIssue } from './validate-geometry';

const column = z.string().trim().min(1).max(64);
const fileDate = z.iso.date('Use a date in the form YYYY-MM-DD.');

export const parcelMappingSchema = z.object({
  reference: column,
  name: column.optional(),
  landUse: column.optional(),
  management: column.optional(),
  lastTillage: column.optional(),
  lastReseeding: column.optional(),
  /** Column with the date the parcel has been in grass since (a dated "grassland" land-use event). */
  grassSince: column.optional(),
  /** One "in grass since" date for every parcel of the file (used where the column is empty or unmapped). */
  grassSinceDate: fileDate.optional(),
  /** One "last ploughed or tilled" date for every parcel of the file. */
  lastTillageDate: fileDate.optional(),
  ownerRef: column.optional(),
  statedArea: column.optional(),
  statedAreaUnit: z.enum(AREA_UNITS).default('ha'),
});
export type ParcelMapping = z.output<typeof parcelMappingSchema>;

export const referenceMappingSchema = z.object({
  kind: z.enum(REFERENCE_KINDS),
  classAttribute: column,
  labelAttribute: column.optional(),
});
export type ReferenceMapping = z.output<typeof referenceMappingSchema>;

export { PARCEL_FIELD_LABELS } from './field-labels';

export interface ParcelFields {
  name: string | null;
  landUse: string | null;
  management: string | null;
  lastTillage: string | null;
  lastReseeding: string | null;
  grassSince: string | null;
  ownerRef: string | null;
  statedArea: { value: number; unit: AreaUnit } | null;
}

/** Columns a mapping names, for checking them against the layer's columns. */
export function mappedColumns(mapping: ParcelMapping | ReferenceMapping): string[] {
  if ('kind' in mapping) return [mapping.classAttribute, mapping.labelAttribute].filter((c): c is string => !!c);
  const { statedAreaUnit: _unit, grassSinceDate: _g, lastTillageDate: _t, ...cols } = mapping;
  return Object.values(cols).filter((c): c is string => typeof c === 'string');
}

const text = (v: AttributeValue | undefined): string | null => {
  if (v === null || v === undefined) return null;
  const s = String(v).trim();
  return s === '' ? null : s;
};

/** "YYYY-MM-DD" or "YYYYMMDD" as a real calendar date; anything else is an error. */
export function readDate(v: AttributeValue | undefined): { date: string | null; bad: boolean } {
  const s = text(v);
  if (s === null) return { date: null, bad: false };
  const m = /^(\d{4})-?(\d{2})-?(\d{2})$/.exec(s);
  const iso = m ? `${m[1]}-${m[2]}-${m[3]}` : '';
  const d = new Date(`${iso}T00:00:00Z`);
  if (!m || Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== iso) return { date: null, bad: true };
  return { date: iso, bad: false };
}

function readArea(v: AttributeValue | undefined): { value: number | null; bad: boolean } {
  if (v === null || v === undefined || v === '') return { value: null, bad: false };
  const n = typeof v === 'number' ? v : Number(String(v).trim().replace(/\s/g, ''));
  if (!Number.isFinite(n) || n < 0) return { value: null, bad: true };
  return { value: n, bad: false };
}

/**
 * A land-use or management value checked against the list the events route uses
 * (land-use-events.ts EVENT_VALUES): the value or its label, any case; null when empty.
 */
export function readChoice(
  v: AttributeValue | undefined,
  kind: 'land-use' | 'management',
): { value: string | null; bad: boolean } {
  const s = text(v)?.toLowerCase() ?? null;
  if (s === null) return { value: null, bad: false };
  const choices = EVENT_VALUES[kind];
  if (Object.hasOwn(choices, s)) return { value: s, bad: false };
  const byLabel = Object.entries(choices).find(([, label]) => label.toLowerCase() === s);
  return byLabel ? { value: byLabel[0], bad: false } : { value: null, bad: true };
}

const GRASS_CHOICES = ['grassland', 'temporary-grassland', 'meadow', 'pasture', 'rough-grazing'];

/** Maps one feature's attributes; `today` ("YYYY-MM-DD") bounds the dates. */
export function mapParcelFeature(
  props: Record<string, AttributeValue>,
  m: ParcelMapping,
  today = new Date().toISOString().slice(0, 10),
): { reference: string | null; fields: ParcelFields; issues: ValidationIssue[] } {
  const issues: ValidationIssue[] = [];
  const reference = text(props[m.reference]);
  if (!reference)
    issues.push({
      code: 'no-reference',
      message: `The parcel reference (column "${m.reference}") is empty.`,
      severity: 'error',
    });
  const date = (col: string | undefined, what: string, fallback?: string) => {
    const r = col ? readDate(props[col]) : { date: null, bad: false };
    const where = col ? ` (column "${col}")` : ' (date for the whole file)';
    if (r.bad)
      issues.push({
        code: 'bad-date',
        message: `${what} "${String(props[col!])}"${where} is not a date (YYYY-MM-DD).`,
        severity: 'error',
      });
    const d = r.date ?? (r.bad ? null : (fallback ?? null));
    if (d !== null && d > today)
      issues.push({
        code: 'bad-date',
        message: `${what} ${d}${r.date ? where : ' (date for the whole file)'} lies in the future (today is ${today}).`,
        severity: 'error',
      });
    else if (d !== null && d < EARLIEST_EVENT_DATE)
      issues.push({
        code: 'bad-date',
        message: `${what} ${d}${r.date ? where : ' (date for the whole file)'} lies before ${EARLIEST_EVENT_DATE.slice(0, 4)}.`,
        severity: 'error',
      });
    return d;
  };
  const lastTillage = date(m.lastTillage, 'Last tillage date', m.lastTillageDate);
  const lastReseeding = date(m.lastReseeding, 'Last reseeding date');
  const grassSince = date(m.grassSince, 'In grass since', m.grassSinceDate);
  let statedArea: ParcelFields['statedArea'] = null;
  if (m.statedArea) {
    const a = readArea(props[m.statedArea]);
    if (a.bad)
      issues.push({
        code: 'bad-area',
        message: `Stated area "${String(props[m.statedArea])}" (column "${m.statedArea}") is not a number of ${m.statedAreaUnit}.`,
        severity: 'error',
      });
    if (a.value !== null) statedArea = { value: a.value, unit: m.statedAreaUnit };
  }
  const choice = (col: string | undefined, kind: 'land-use' | 'management', what: string) => {
    if (!col) return null;
    const r = readChoice(props[col], kind);
    if (r.bad)
      issues.push({
        code: `bad-${kind}`,
        message: `${what} "${String(props[col])}" (column "${col}") is not on the list; use one of: ${Object.keys(EVENT_VALUES[kind]).join(', ')}.`,
        severity: 'error',
      });
    return r.value;
  };
  const landUse = choice(m.landUse, 'land-use', 'Land use');
  if (grassSince && landUse && !GRASS_CHOICES.includes(landUse)) {
    issues.push({
      code: 'history-contradiction',
      message: `The parcel is said to be in grass since ${grassSince} but its current land use is "${landUse}".`,
      severity: 'error',
    });
  }
  return {
    reference,
    fields: {
      name: m.name ? text(props[m.name]) : null,
      landUse,
      management: choice(m.management, 'management', 'Management'),
      lastTillage,
      lastReseeding,
      grassSince,
      ownerRef: m.ownerRef ? text(props[m.ownerRef]) : null,
      statedArea,
    },
    issues,
  };
}

export function mapReferenceFeature(
  props: Record<string, AttributeValue>,
  m: ReferenceMapping,
): { cls: string | null; label: string | null; issues: ValidationIssue[] } {
  const problem = classProblem(m.kind, props[m.classAttribute]);
  const cls = problem ? null : String(props[m.classAttribute]).trim();
  const issues: ValidationIssue[] = problem
    ? [{ code: 'bad-class', message: `${problem} (column "${m.classAttribute}")`, severity: 'error' }]
    : [];
  return { cls, label: m.labelAttribute ? text(props[m.labelAttribute]) : null, issues };
}
