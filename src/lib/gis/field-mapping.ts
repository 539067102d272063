/**
 * The attribute-mapping step: which source column feeds which Swardkeep field, and reading
 * one feature's values through it (pure). Bad values are reported per feature, never guessed.
 */
import { z } from 'zod';
import { AREA_UNITS, type AreaUnit } from './area-units';
import { classProblem, REFERENCE_KINDS } from './reference-kinds';
import type { AttributeValue } from './types';
import type { ValidationIssue } from './validate-geometry';

const column = z.string().trim().min(1).max(64);

export const parcelMappingSchema = z.object({
  reference: column,
  name: column.optional(),
  landUse: column.optional(),
  management: column.optional(),
  lastTillage: column.optional(),
  lastReseeding: column.optional(),
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

/** Fields a parcel mapping can fill, with their labels for the wizard. */
export const PARCEL_FIELD_LABELS: Record<Exclude<keyof ParcelMapping, 'statedAreaUnit'>, string> = {
  reference: 'Parcel reference',
  name: 'Field name',
  landUse: 'Current land use',
  management: 'Current management',
  lastTillage: 'Last tillage date',
  lastReseeding: 'Last reseeding date',
  ownerRef: 'Owner or holding reference (private)',
  statedArea: 'Stated area',
};

export interface ParcelFields {
  name: string | null;
  landUse: string | null;
  management: string | null;
  lastTillage: string | null;
  lastReseeding: string | null;
  ownerRef: string | null;
  statedArea: { value: number; unit: AreaUnit } | null;
}

/** Columns a mapping names, for checking them against the layer's columns. */
export function mappedColumns(mapping: ParcelMapping | ReferenceMapping): string[] {
  if ('kind' in mapping) return [mapping.classAttribute, mapping.labelAttribute].filter((c): c is string => !!c);
  const { statedAreaUnit: _unit, ...cols } = mapping;
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

export function mapParcelFeature(props: Record<string, AttributeValue>, m: ParcelMapping): { reference: string | null; fields: ParcelFields; issues: ValidationIssue[] } {
  const issues: ValidationIssue[] = [];
  const reference = text(props[m.reference]);
  if (!reference) issues.push({ code: 'no-reference', message: `The parcel reference (column "${m.reference}") is empty.`, severity: 'error' });
  const date = (col: string | undefined, what: string) => {
    if (!col) return null;
    const r = readDate(props[col]);
    if (r.bad) issues.push({ code: 'bad-date', message: `${what} "${String(props[col])}" (column "${col}") is not a date (YYYY-MM-DD).`, severity: 'error' });
    return r.date;
  };
  const lastTillage = date(m.lastTillage, 'Last tillage date');
  const lastReseeding = date(m.lastReseeding, 'Last reseeding date');
  let statedArea: ParcelFields['statedArea'] = null;
  if (m.statedArea) {
    const a = readArea(props[m.statedArea]);
    if (a.bad) issues.push({ code: 'bad-area', message: `Stated area "${String(props[m.statedArea])}" (column "${m.statedArea}") is not a number of ${m.statedAreaUnit}.`, severity: 'error' });
    if (a.value !== null) statedArea = { value: a.value, unit: m.statedAreaUnit };
  }
  const lower = (col: string | undefined) => (col ? (text(props[col])?.toLowerCase() ?? null) : null);
  return {
    reference,
    fields: {
      name: m.name ? text(props[m.name]) : null,
      landUse: lower(m.landUse),
      management: lower(m.management),
      lastTillage,
      lastReseeding,
      ownerRef: m.ownerRef ? text(props[m.ownerRef]) : null,
      statedArea,
    },
    issues,
  };
}

export function mapReferenceFeature(props: Record<string, AttributeValue>, m: ReferenceMapping): { cls: string | null; label: string | null; issues: ValidationIssue[] } {
  const problem = classProblem(m.kind, props[m.classAttribute]);
  const cls = problem ? null : String(props[m.classAttribute]).trim();
  const issues: ValidationIssue[] = problem ? [{ code: 'bad-class', message: `${problem} (column "${m.classAttribute}")`, severity: 'error' }] : [];
  return { cls, label: m.labelAttribute ? text(props[m.labelAttribute]) : null, issues };
}
