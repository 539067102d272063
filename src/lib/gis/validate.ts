import { createHash } from 'node:crypto';
import type { Geometry, MultiPolygon, Polygon } from 'geojson';
import { crossesAntimeridian, splitAtAntimeridian } from './antimeridian';
import { measureGeometry } from './area';
import { areaToleranceM2, toSquareMetres, type AreaUnit } from './area-units';
import { firstOutsideAreaOfUse, firstOutsideWgs84, type CrsDefinition } from './crs';
import { referenceKey, referenceProblem } from './references';
import { checkGeometry, type ValidationIssue } from './validate-geometry';

export type { ValidationIssue } from './validate-geometry';

/** One feature to validate; geometry already reprojected to EPSG:4326. */
export interface FeatureToValidate {
  geometry: Geometry | null | undefined;
  /** Parcel reference from the mapped column, used for duplicate detection. */
  reference?: string | null;
  /** Area stated in the source data, with its unit. */
  statedArea?: { value: number; unit: AreaUnit } | null;
}

export interface ValidationOptions {
  /** Parcels smaller than this are slivers and rejected, m². Default 100 m² (0.01 ha), common practice. */
  minAreaM2?: number;
  /** Tolerance buffer per metre of perimeter, m. Default 1.25 (EU Implementing Reg. 809/2014 Art. 38(4)). */
  toleranceMetresPerPerimeterMetre?: number;
  /** Tolerance cap, m². Default 10 000 m² = 1 ha (same article). */
  toleranceCapM2?: number;
  /** What a stated-vs-computed area disagreement does. Default 'reject'. */
  areaMismatch?: 'reject' | 'warn';
  /** Source CRS, for the area-of-use check; omit for WGS 84 input. */
  sourceCrs?: CrsDefinition | null;
  /** Margin around the CRS area of use, degrees. Default 1°. */
  areaOfUseMarginDeg?: number;
}

export type FeatureStatus = 'ok' | 'repaired' | 'rejected';

export interface FeatureReport {
  index: number;
  reference: string | null;
  status: FeatureStatus;
  issues: ValidationIssue[];
  /** Ellipsoidal WGS 84 area, ha (null when rejected before measuring). */
  areaHa: number | null;
  /** Geodesic perimeter of all rings, m. */
  perimeterM: number | null;
  /** Normalised geometry in EPSG:4326, or null when the geometry is unusable. */
  geometry: MultiPolygon | null;
}

export interface ValidationReport {
  features: FeatureReport[];
  summary: { total: number; ok: number; repaired: number; rejected: number; byCode: Record<string, number> };
}

/** Order-independent key of a MultiPolygon: rings rotated to their smallest vertex, 1e-7° (~1 cm) rounding. */
export function geometryKey(geometry: MultiPolygon): string {
  const ringKey = (ring: number[][]) => {
    const pts = ring.slice(0, -1).map((p) => `${p[0]!.toFixed(7)},${p[1]!.toFixed(7)}`);
    const start = pts.indexOf([...pts].sort()[0]!);
    return [...pts.slice(start), ...pts.slice(0, start)].join(' ');
  };
  return geometry.coordinates
    .map((rings) => rings.map(ringKey).join('|'))
    .sort()
    .join('#');
}

function checkRanges(geometry: MultiPolygon, options: ValidationOptions): ValidationIssue | null {
  const outside = firstOutsideWgs84(geometry);
  if (outside) {
    return {
      code: 'coordinates-out-of-range',
      message: `Coordinate (${outside[0]}, ${outside[1]}) is not a valid longitude/latitude; check the CRS.`,
      severity: 'error',
    };
  }
  const crs = options.sourceCrs;
  const far = crs ? firstOutsideAreaOfUse(geometry, crs, options.areaOfUseMarginDeg ?? 1) : null;
  if (crs && far) {
    return {
      code: 'outside-crs-area',
      message:
        `Point (${far[0]!.toFixed(5)}, ${far[1]!.toFixed(5)}) lies outside the area of use ` +
        `of ${crs.name}${crs.epsg ? ` (EPSG:${crs.epsg})` : ''}; the CRS is probably wrong.`,
      severity: 'error',
    };
  }
  return null;
}

function checkStatedArea(
  f: FeatureToValidate,
  areaM2: number,
  perimeterM: number,
  o: ValidationOptions,
): ValidationIssue | null {
  if (!f.statedArea || !Number.isFinite(f.statedArea.value)) return null;
  const statedM2 = toSquareMetres(f.statedArea.value, f.statedArea.unit);
  const toleranceM2 = areaToleranceM2(
    perimeterM,
    o.toleranceMetresPerPerimeterMetre ?? 1.25,
    o.toleranceCapM2 ?? 10_000,
  );
  if (Math.abs(statedM2 - areaM2) <= toleranceM2) return null;
  return {
    code: 'area-mismatch',
    message:
      `Stated area ${f.statedArea.value} ${f.statedArea.unit} (${(statedM2 / 1e4).toFixed(4)} ha) differs ` +
      `from the measured ${(areaM2 / 1e4).toFixed(4)} ha by more than the tolerance of ${(toleranceM2 / 1e4).toFixed(4)} ha.`,
    severity: o.areaMismatch === 'warn' ? 'warning' : 'error',
  };
}

/**
 * Validates features before saving: geometry checks and repairs (validate-geometry.ts),
 * coordinate ranges, slivers, references (invisible or mixed-script characters refused),
 * duplicates (same reference key or same geometry: the later one is rejected) and stated vs ellipsoidal area. Pure; order of `features` is kept.
 */
/**
 * What validation remembers across the file to find duplicates: reference keys and boundary
 * keys of the features seen so far (boundary keys as SHA-256 digests, so a large file's keys stay
 * small). Pass one to validateFeatures chunk after chunk to validate a file in pieces.
 */
export interface SeenSoFar {
  refs: Map<string, { index: number; reference: string }>;
  geoms: Map<string, number>;
}
export const seenNothing = (): SeenSoFar => ({ refs: new Map(), geoms: new Map() });

/** `offset` is the index of the first feature in the whole file, when `features` is one chunk of it. */
export function validateFeatures(
  features: FeatureToValidate[],
  options: ValidationOptions = {},
  seen: SeenSoFar = seenNothing(),
  offset = 0,
): ValidationReport {
  const { refs: seenRefs, geoms: seenGeoms } = seen;
  const reports = features.map((f, at): FeatureReport => {
    const index = offset + at;
    const reference = f.reference?.trim() || null;
    const cut = crossesAntimeridian(f.geometry) ? splitAtAntimeridian(f.geometry as Polygon | MultiPolygon) : null;
    const checked = checkGeometry(cut ?? f.geometry);
    const issues = [...checked.issues];
    if (cut) {
      issues.unshift({
        code: 'antimeridian-split',
        message:
          `The boundary crosses the antimeridian (180°); it was cut there into ${cut.coordinates.length} ` +
          `parts, one on each side (RFC 7946 §3.1.9). The area is unchanged.`,
        severity: 'repaired',
      });
    }
    let geometry = checked.geometry;
    let areaHa: number | null = null;
    let perimeterM: number | null = null;
    const range = geometry ? checkRanges(geometry, options) : null;
    if (range) issues.push(range);
    if (geometry && !range) {
      const m = measureGeometry(geometry);
      areaHa = m.areaHa;
      perimeterM = m.perimeterM;
      const minAreaM2 = options.minAreaM2 ?? 100;
      if (m.areaM2 < minAreaM2) {
        issues.push({
          code: 'sliver',
          message: `The parcel measures ${m.areaM2.toFixed(1)} m², below the minimum of ${minAreaM2} m² (a sliver).`,
          severity: 'error',
        });
      }
      const mismatch = checkStatedArea(f, m.areaM2, m.perimeterM, options);
      if (mismatch) issues.push(mismatch);
      const key = createHash('sha256').update(geometryKey(geometry)).digest('base64');
      const twin = seenGeoms.get(key);
      if (twin !== undefined)
        issues.push({
          code: 'duplicate-geometry',
          message: `Same geometry as feature ${twin + 1}.`,
          severity: 'error',
        });
      else seenGeoms.set(key, index);
    }
    const refProblem = reference ? referenceProblem(reference) : null;
    if (refProblem) issues.push({ code: 'bad-reference', message: refProblem, severity: 'error' });
    else if (reference) {
      const key = referenceKey(reference);
      const twin = seenRefs.get(key);
      const same =
        twin === undefined
          ? ''
          : twin.reference === reference
            ? ''
            : ` as "${twin.reference}" (the same once case, width and look-alike letters are set aside)`;
      if (twin !== undefined)
        issues.push({
          code: 'duplicate-reference',
          message: `Parcel reference "${reference}" is also used by feature ${twin.index + 1}${same}.`,
          severity: 'error',
        });
      else seenRefs.set(key, { index, reference });
    }
    const rejected = issues.some((i) => i.severity === 'error');
    if (rejected && checked.geometry === null) geometry = null;
    const status: FeatureStatus = rejected
      ? 'rejected'
      : issues.some((i) => i.severity === 'repaired')
        ? 'repaired'
        : 'ok';
    return { index, reference, status, issues, areaHa, perimeterM, geometry };
  });
  return { features: reports, summary: summarise(reports) };
}

function summarise(reports: FeatureReport[]): ValidationReport['summary'] {
  const byCode: Record<string, number> = {};
  for (const r of reports) for (const i of r.issues) byCode[i.code] = (byCode[i.code] ?? 0) + 1;
  const count = (s: FeatureStatus) => reports.filter((r) => r.status === s).length;
  return { total: reports.length, ok: count('ok'), repaired: count('repaired'), rejected: count('rejected'), byCode };
}
