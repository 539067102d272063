/**
 * PROJ, the reference implementation of coordinate operations, through Debian's proj-bin
 * (`projinfo`; scripts/ensure-system.sh installs it). Server-only: runs a local program,
 * nothing is looked up online. PostGIS's ST_Transform uses the same PROJ library and database.
 */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { GisInputError } from './errors';

const run = promisify(execFile);

/** stdout and stderr together (projinfo writes the identification list to stderr). */
async function projinfo(args: string[]): Promise<string> {
  try {
    const { stdout, stderr } = await run('projinfo', args, { timeout: 15_000, maxBuffer: 4 * 1024 * 1024 });
    return `${stderr}\n${stdout}`;
  } catch (error) {
    const e = error as NodeJS.ErrnoException & { stdout?: string; stderr?: string };
    if (e.code === 'ENOENT')
      throw new Error('projinfo (Debian package proj-bin) is not installed; run scripts/ensure-system.sh.', {
        cause: error,
      });
    return `${e.stderr ?? ''}\n${e.stdout ?? ''}`;
  }
}

/** Minimum confidence of `projinfo --identify` to take its EPSG code (PROJ gives 70 % for a match by parameters with another name). */
export const IDENTIFY_MIN_CONFIDENCE = 70;

/**
 * The EPSG code PROJ identifies a WKT (ESRI or OGC) as, or null when PROJ finds none, only weak
 * ones, or several equally good ones.
 */
export async function identifyEpsg(wkt: string): Promise<{ code: number; confidence: number } | null> {
  const text = wkt.trim();
  if (!/^[A-Za-z]/.test(text)) return null; // WKT starts with a keyword; never pass an option-like argument
  const out = await projinfo(['--identify', '-o', 'PROJ', text]);
  const hits = [...out.matchAll(/^EPSG:(\d+): (\d+) %$/gm)].map((m) => ({
    code: Number(m[1]),
    confidence: Number(m[2]),
  }));
  const best = hits.filter((h) => h.confidence >= IDENTIFY_MIN_CONFIDENCE).sort((a, b) => b.confidence - a.confidence);
  if (best.length === 0 || (best.length > 1 && best[1]!.confidence === best[0]!.confidence)) return null;
  return best[0]!;
}

/**
 * The coordinate operations PROJ knows from EPSG:code to WGS 84 (EPSG:4326), best first; a
 * "ballpark" operation (ellipsoid change only, no datum shift) does not count.
 */
export async function transformationsToWgs84(code: number): Promise<string[]> {
  const out = await projinfo(['-s', `EPSG:${code}`, '-t', 'EPSG:4326', '--summary', '--spatial-test', 'intersects']);
  return out
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '' && !/^Candidate operations found/.test(l) && !/ballpark/i.test(l));
}

export function unknownDatumError(what: string): GisInputError {
  return new GisInputError(
    'unknown-datum',
    `${what} is on a datum for which no transformation to WGS 84 is known, so its coordinates cannot be placed to ` +
      `the metre. Choose the coordinate reference system by EPSG code (one with a known transformation), or add TOWGS84 parameters to the .prj.`,
  );
}
