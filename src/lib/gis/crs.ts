import proj4 from 'proj4';
import type { Geometry, Position } from 'geojson';
import { GisInputError } from './errors';
import { bboxOf, forEachPosition, mapPositions } from './rings';

/**
 * Pure CRS handling: definitions, reprojection to EPSG:4326 with proj4, and range checks.
 * Nothing here reads files or the network; the EPSG catalogue lives in crs-catalogue.server.ts.
 * Datum shifts: 7-parameter Helmert shifts that proj4 knows (from +towgs84 or the WKT datum
 * name) are applied; NTv2 grid files are not shipped, so grid-based shifts are not applied.
 */
export interface CrsDefinition {
  /** EPSG code when known, else null (e.g. a .prj we could only read as WKT). */
  epsg: number | null;
  name: string;
  /** A proj4 definition string or a WKT string that proj4 can parse. */
  definition: string;
  /** Area of use in WGS 84 degrees [west, south, east, north], or null when unknown. */
  areaOfUse: [number, number, number, number] | null;
  /** True when coordinates are longitude/latitude in degrees. */
  isGeographic: boolean;
}

export const WGS84_DEFINITION = '+proj=longlat +datum=WGS84 +no_defs';

export const WGS84: CrsDefinition = {
  epsg: 4326,
  name: 'WGS 84',
  definition: WGS84_DEFINITION,
  areaOfUse: [-180, -90, 180, 90],
  isGeographic: true,
};

/**
 * The EPSG code of the outermost object of a WKT string: the AUTHORITY["EPSG","n"] (WKT 1)
 * or ID["EPSG",n] (WKT 2) directly inside the top-level bracket. Nested ones (datum,
 * ellipsoid, units) are ignored. Returns null when there is none.
 */
export function epsgCodeFromWkt(wkt: string): number | null {
  const pattern = /(?:AUTHORITY|ID)\[\s*"EPSG"\s*,\s*"?(\d+)"?/gi;
  let found: number | null = null;
  for (const match of wkt.matchAll(pattern)) {
    const before = wkt.slice(0, match.index);
    const depth = (before.match(/[[(]/g) ?? []).length - (before.match(/[\])]/g) ?? []).length;
    if (depth === 1) found = Number(match[1]);
  }
  return found;
}

/** The name of the outermost WKT object (first quoted string), e.g. "WGS_1984_UTM_Zone_30N". */
export function nameFromWkt(wkt: string): string | null {
  return /^\s*\w+\s*\[\s*"([^"]*)"/.exec(wkt)?.[1] ?? null;
}

const converters = new Map<string, proj4.Converter>();

function converterFor(crs: CrsDefinition): proj4.Converter {
  let converter = converters.get(crs.definition);
  if (!converter) {
    try {
      converter = proj4(crs.definition, WGS84_DEFINITION);
    } catch (error) {
      throw new GisInputError(
        'bad-prj',
        `The coordinate reference system "${crs.name}" cannot be read: ${(error as Error).message}`,
        { cause: error },
      );
    }
    converters.set(crs.definition, converter);
  }
  return converter;
}

/** Builds a CRS from .prj WKT text alone (no catalogue). Throws GisInputError('bad-prj'). */
export function crsFromWkt(wkt: string): CrsDefinition {
  const crs: CrsDefinition = {
    epsg: epsgCodeFromWkt(wkt),
    name: nameFromWkt(wkt) ?? 'unnamed CRS from .prj',
    definition: wkt,
    areaOfUse: null,
    isGeographic: /^\s*GEOG(?:CS|CRS)?\s*\[/i.test(wkt) || /^\s*GEOGRAPHICCRS\s*\[/i.test(wkt),
  };
  converterFor(crs);
  return crs;
}

const WGS84_LIKE_DATUM =
  /DATUM\s*\[\s*"(D_)?(WGS_?(19)?84|World[ _]Geodetic[ _]System[ _]1984|ETRS_?(19)?89|European[ _]Terrestrial[ _]Reference[ _]System[ _]1989|World Geodetic System 1984 ensemble|European Terrestrial Reference System 1989 ensemble)"/i;

/**
 * True when getting from `crs` to WGS 84 needs a datum transformation (more than the metre-level
 * identity of WGS 84 and ETRS89 / GRS 1980, common practice at parcel scale): grids, non-zero
 * TOWGS84, another datum or another ellipsoid.
 */
export function needsDatumShift(crs: CrsDefinition): boolean {
  const d = crs.definition.trim();
  if (/^[A-Z_]+\s*\[/i.test(d)) {
    const towgs = /TOWGS84\s*\[([^\]]*)\]/i.exec(d);
    if (towgs) return towgs[1]!.split(',').some((v) => Number(v) !== 0);
    return !WGS84_LIKE_DATUM.test(d);
  }
  if (/\+nadgrids=/.test(d)) return true;
  const towgs = /\+towgs84=([^\s]+)/.exec(d);
  if (towgs) return towgs[1]!.split(',').some((v) => Number(v) !== 0);
  const datum = /\+datum=(\S+)/.exec(d)?.[1];
  if (datum) return datum !== 'WGS84';
  const ellps = /\+ellps=(\S+)/.exec(d)?.[1];
  if (ellps) return ellps !== 'WGS84' && ellps !== 'GRS80';
  return /\+a=/.test(d);
}

/** Converts one position (x, y in the source CRS) to [lon, lat] in EPSG:4326 degrees. */
export function toWgs84(position: Position, crs: CrsDefinition): Position {
  if (crs.definition === WGS84_DEFINITION) return [position[0]!, position[1]!];
  const [lon, lat] = converterFor(crs).forward([position[0]!, position[1]!]);
  if (!Number.isFinite(lon) || !Number.isFinite(lat)) {
    throw new GisInputError(
      'unknown-crs',
      `Coordinates (${position[0]}, ${position[1]}) cannot be converted from "${crs.name}" to WGS 84.`,
    );
  }
  return [lon!, lat!];
}

/** Converts [lon, lat] in EPSG:4326 degrees to x, y in `crs`. */
export function fromWgs84(position: Position, crs: CrsDefinition): Position {
  if (crs.definition === WGS84_DEFINITION) return [position[0]!, position[1]!];
  const [x, y] = converterFor(crs).inverse([position[0]!, position[1]!]);
  return [x!, y!];
}

/** Reprojects any geometry from `crs` to EPSG:4326 (lon, lat degrees); z values are dropped. */
export function reproject<G extends Geometry>(geometry: G, crs: CrsDefinition): G {
  return mapPositions(geometry, (p) => toWgs84(p, crs));
}

/** True when a bbox could be longitude/latitude degrees (|x| ≤ 180, |y| ≤ 90). */
export function bboxLooksLikeDegrees(bbox: [number, number, number, number]): boolean {
  return bbox[0] >= -180 && bbox[2] <= 180 && bbox[1] >= -90 && bbox[3] <= 90;
}

/** First position outside the valid WGS 84 range (±180° lon, ±90° lat) or not finite, else null. */
export function firstOutsideWgs84(geometry: Geometry): Position | null {
  let bad: Position | null = null;
  forEachPosition(geometry, (p) => {
    const ok = Number.isFinite(p[0]) && Number.isFinite(p[1]) && Math.abs(p[0]!) <= 180 && Math.abs(p[1]!) <= 90;
    if (!ok && bad === null) bad = p;
  });
  return bad;
}

/**
 * First position (lon, lat) outside the CRS's area of use widened by `marginDeg`, else null.
 * A parcel far outside the area of use almost always means the wrong CRS was chosen.
 */
export function firstOutsideAreaOfUse(geometry4326: Geometry, crs: CrsDefinition, marginDeg = 1): Position | null {
  const area = crs.areaOfUse;
  if (!area) return null;
  const [w, s, e, n] = area;
  let bad: Position | null = null;
  const crossesAntimeridian = w > e;
  forEachPosition(geometry4326, (p) => {
    const lon = p[0]!;
    const lat = p[1]!;
    const lonOk = crossesAntimeridian
      ? lon >= w - marginDeg || lon <= e + marginDeg
      : lon >= w - marginDeg && lon <= e + marginDeg;
    const latOk = lat >= s - marginDeg && lat <= n + marginDeg;
    if (!(lonOk && latOk) && bad === null) bad = p;
  });
  return bad;
}

/** Bounding box of a geometry in its own coordinates; see rings.bboxOf. */
export { bboxOf };
