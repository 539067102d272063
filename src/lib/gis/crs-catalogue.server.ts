import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { GisInputError } from './errors';
import {
  crsFromWkt,
  epsgCodeFromWkt,
  fromWgs84,
  nameFromWkt,
  needsDatumShift,
  toWgs84,
  type CrsDefinition,
} from './crs';
import { identifyEpsg, transformationsToWgs84, unknownDatumError } from './proj-cli.server';

/**
 * The EPSG catalogue shipped in the epsg-index package (all.json, ~8 MB), loaded lazily on
 * first use and kept in memory. Server-only (reads node_modules). Nothing is looked up online.
 */
interface EpsgEntry {
  code: string;
  kind: string;
  name: string;
  wkt: string | null;
  proj4: string | null;
  /** [north, west, south, east] in degrees, as stored by epsg-index. */
  bbox: [number, number, number, number] | null;
  area: string | null;
}

export interface CrsSearchHit {
  epsg: number;
  name: string;
  kind: 'projected' | 'geographic';
  areaOfUse: string;
}

/** Picker kinds: projected and 2D geographic CRSs with a proj4 definition. */
const PICKABLE_KINDS = new Set(['CRS-PROJCRS', 'CRS-GEOGCRS']);
/**
 * Frequently used national grids, pan-European and world CRSs ranked first in the picker
 * (common practice; codes from the EPSG registry as shipped in epsg-index).
 */
const COMMON_CODES = new Set([
  4326, 3857, 4258, 3035, 27700, 2157, 29903, 2154, 31370, 28992, 3006, 3067, 2056, 5514, 2180, 31467, 31468, 3416,
  23700, 3763, 2100, 3844, 3794, 2193, 7855, 3577, 5070, 3978, 25829, 25830, 25831, 25832, 25833, 25834, 25835,
]);

let loading: Promise<Map<number, EpsgEntry>> | null = null;

async function catalogue(): Promise<Map<number, EpsgEntry>> {
  loading ??= (async () => {
    const path = createRequire(import.meta.url).resolve('epsg-index/all.json');
    const all = JSON.parse(await readFile(path, 'utf8')) as Record<string, EpsgEntry>;
    const map = new Map<number, EpsgEntry>();
    for (const entry of Object.values(all))
      if (entry.proj4 && PICKABLE_KINDS.has(entry.kind)) map.set(Number(entry.code), entry);
    return map;
  })();
  return loading;
}

function toDefinition(entry: EpsgEntry): CrsDefinition {
  // proj4js has no NTv2 grid files: for "+nadgrids=<file>" prefer the WKT, where proj4js
  // applies a Helmert shift it knows by datum name (e.g. OSGB36), instead of returning NaN.
  const needsGrid = /\+nadgrids=(?!@)/.test(entry.proj4 ?? '');
  const definition = needsGrid && entry.wkt ? entry.wkt : entry.proj4!;
  const b = entry.bbox;
  return {
    epsg: Number(entry.code),
    name: entry.name,
    definition,
    areaOfUse: b ? [b[1], b[2], b[3], b[0]] : null,
    isGeographic: entry.kind === 'CRS-GEOGCRS',
  };
}

/** The CRS for an EPSG code. Throws GisInputError('unknown-crs') for codes not in the catalogue. */
export async function crsFromEpsg(code: number): Promise<CrsDefinition> {
  const entry = (await catalogue()).get(code);
  if (!entry)
    throw new GisInputError('unknown-crs', `EPSG:${code} is not a projected or geographic CRS known to this app.`);
  return toDefinition(entry);
}

/** Lower-case alphanumerics with "1984"-style years cut to "84", so ESRI and EPSG names compare. */
export function normaliseCrsName(name: string): string {
  return name
    .toLowerCase()
    .replace(/(^|\D)19(\d\d)(?!\d)/g, '$1$2')
    .replace(/[^a-z0-9]/g, '');
}

let byName: Promise<Map<string, number | null>> | null = null;
async function nameIndex(): Promise<Map<string, number | null>> {
  byName ??= catalogue().then((map) => {
    const index = new Map<string, number | null>();
    const add = (key: string, code: number) => index.set(key, index.has(key) && index.get(key) !== code ? null : code);
    for (const [code, e] of map) {
      add(normaliseCrsName(e.name), code);
      const projection = e.name.split(' / ')[1];
      if (projection) add(normaliseCrsName(projection), code); // "British National Grid" alone
    }
    return index;
  });
  return byName;
}

/** Same CRS? Compare a round trip through both at the centre of the area of use (≤ 5 m). */
function agrees(a: CrsDefinition, wkt: CrsDefinition): boolean {
  if (!a.areaOfUse) return false;
  const [w, s, e, n] = a.areaOfUse;
  const centre = [(w + e) / 2, (s + n) / 2];
  const xy = fromWgs84(centre, a);
  const back = toWgs84(xy, wkt);
  const metres = Math.hypot(
    (back[0]! - centre[0]!) * 111_320 * Math.cos((centre[1]! * Math.PI) / 180),
    (back[1]! - centre[1]!) * 110_540,
  );
  return metres <= 5;
}

/**
 * Refuses a CRS whose datum PROJ knows no transformation to WGS 84 for (only a "ballpark"
 * ellipsoid change), instead of dropping the datum shift silently.
 */
export async function assertDatumShiftKnown(crs: CrsDefinition): Promise<CrsDefinition> {
  if (crs.epsg === null || !needsDatumShift(crs)) return crs;
  if ((await transformationsToWgs84(crs.epsg)).length === 0) throw unknownDatumError(`EPSG:${crs.epsg} (${crs.name})`);
  return crs;
}

/**
 * The CRS of a .prj: its EPSG authority code when present; else the EPSG code PROJ identifies
 * it as (`projinfo --identify`, so an ESRI WKT of RD New, Belgian Lambert 72 or a Gauss-Krüger
 * zone gets EPSG's datum transformation); else an EPSG entry whose name matches (ESRI spelling)
 * and whose parameters agree; else the WKT itself read by proj4, but only when it is on WGS 84
 * or carries its own TOWGS84: an unknown datum is refused, never read without its shift.
 */
export async function crsFromPrj(wkt: string): Promise<CrsDefinition> {
  const fromWkt = crsFromWkt(wkt);
  const map = await catalogue();
  const code = epsgCodeFromWkt(wkt);
  if (code !== null && map.has(code)) return assertDatumShiftKnown(toDefinition(map.get(code)!));
  const identified = await identifyEpsg(wkt);
  if (identified && map.has(identified.code)) return assertDatumShiftKnown(toDefinition(map.get(identified.code)!));
  const name = nameFromWkt(wkt);
  const match = name ? (await nameIndex()).get(normaliseCrsName(name)) : undefined;
  if (match) {
    const candidate = toDefinition(map.get(match)!);
    if (agrees(candidate, fromWkt)) return assertDatumShiftKnown(candidate);
  }
  if (needsDatumShift(fromWkt) && !/TOWGS84\s*\[/i.test(wkt)) throw unknownDatumError(`The .prj "${fromWkt.name}"`);
  return fromWkt;
}

/**
 * Searchable CRS list for the picker: by code ("27700", "EPSG:32630") or by words in the
 * name or area ("utm 33n", "british", "lambert france"). Common grids rank first.
 */
export async function searchCrs(query: string, limit = 20): Promise<CrsSearchHit[]> {
  const q = query
    .trim()
    .toLowerCase()
    .replace(/^epsg:?\s*/, '');
  if (!q) return [];
  const scored: { hit: CrsSearchHit; score: number }[] = [];
  const tokens = q.split(/\s+/);
  for (const [code, e] of await catalogue()) {
    const name = e.name.toLowerCase();
    let score = 0;
    if (/^\d+$/.test(q)) score = String(code) === q ? 100 : String(code).startsWith(q) ? 10 : 0;
    else if (tokens.every((t) => name.includes(t))) score = 20 + (name.startsWith(tokens[0]!) ? 5 : 0);
    else if (tokens.every((t) => name.includes(t) || (e.area ?? '').toLowerCase().includes(t))) score = 5;
    if (score === 0) continue;
    if (COMMON_CODES.has(code)) score += 8;
    if (/^(wgs 84|etrs89) \/ utm zone \d+[ns]$/.test(name)) score += 6;
    if (name.includes('deprecated')) score -= 10;
    const kind = e.kind === 'CRS-GEOGCRS' ? 'geographic' : 'projected';
    scored.push({ hit: { epsg: code, name: e.name, kind, areaOfUse: e.area ?? '' }, score });
  }
  scored.sort((a, b) => b.score - a.score || a.hit.name.length - b.hit.name.length || a.hit.epsg - b.hit.epsg);
  return scored.slice(0, Math.max(0, limit)).map((s) => s.hit);
}
