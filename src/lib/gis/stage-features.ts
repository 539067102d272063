/**
 * Maps and validates an upload's features, already in EPSG:4326 (pure): the column mapping
 * (field-mapping.ts), the reference key, the geometry and area checks (validate.ts). A rejected
 * self-intersecting polygon keeps its raw geometry so PostGIS can try ST_MakeValid on it.
 */
import type { Geometry } from 'geojson';
import { toSquareMetres } from './area-units';
import type { CrsDefinition } from './crs';
import { mapParcelFeature, mapReferenceFeature, type ParcelMapping, type ReferenceMapping } from './field-mapping';
import { referenceKey } from './references';
import type { RawFeature } from './types';
import {
  seenNothing,
  validateFeatures,
  type FeatureToValidate,
  type SeenSoFar,
  type ValidationIssue,
} from './validate';

export type StageOptions = {
  minAreaM2: number;
  toleranceMetresPerPerimeterMetre: number;
  toleranceCapM2: number;
  areaMismatch: 'reject' | 'warn';
  sourceCrs: CrsDefinition | null;
};

export type StagedFeature = {
  idx: number;
  status: 'ok' | 'repaired' | 'rejected';
  reference: string | null;
  issues: { code: string; message: string; severity: string }[];
  fields: Record<string, unknown>;
  geom: unknown | null;
  rawGeom: unknown | null;
};

function isSelfIntersectingPolygon(raw: Geometry | null, issues: ValidationIssue[]): boolean {
  return (
    !!raw &&
    (raw.type === 'Polygon' || raw.type === 'MultiPolygon') &&
    issues.some((i) => i.code === 'self-intersection')
  );
}

/** `seen` and `offset` stage a file chunk by chunk: duplicates are found across chunks and `idx` counts from the file's start. */
export function stageFeatures(
  features: RawFeature[],
  purpose: 'parcels' | 'reference',
  mapping: ParcelMapping | ReferenceMapping,
  options: StageOptions,
  seen: SeenSoFar = seenNothing(),
  offset = 0,
): StagedFeature[] {
  const mapped = features.map((f) => {
    if ('kind' in mapping) {
      const r = mapReferenceFeature(f.properties, mapping);
      return { reference: null, fields: { class: r.cls, label: r.label }, issues: r.issues, stated: null };
    }
    const r = mapParcelFeature(f.properties, mapping);
    const statedAreaHa = r.fields.statedArea
      ? toSquareMetres(r.fields.statedArea.value, r.fields.statedArea.unit) / 10_000
      : null;
    return {
      reference: r.reference,
      fields: { ...r.fields, statedAreaHa, referenceKey: r.reference ? referenceKey(r.reference) : null },
      issues: r.issues,
      stated: r.fields.statedArea,
    };
  });
  const toValidate: FeatureToValidate[] = features.map((f, i) => ({
    geometry: f.geometry,
    reference: purpose === 'parcels' ? mapped[i]!.reference : null,
    statedArea: mapped[i]!.stated,
  }));
  const report = validateFeatures(toValidate, options, seen, offset);
  return report.features.map((r, i) => {
    const issues = [...mapped[i]!.issues, ...r.issues];
    const rejected = issues.some((x) => x.severity === 'error');
    const status = rejected ? 'rejected' : r.status;
    const raw = features[i]!.geometry;
    return {
      idx: offset + i,
      status,
      reference: mapped[i]!.reference,
      issues,
      // The measured area is kept for the report even when the boundary itself is not staged.
      fields: r.areaHa === null ? mapped[i]!.fields : { ...mapped[i]!.fields, measuredAreaHa: r.areaHa },
      geom: rejected ? null : r.geometry,
      rawGeom: rejected && isSelfIntersectingPolygon(raw, r.issues) ? raw : null,
    };
  });
}
