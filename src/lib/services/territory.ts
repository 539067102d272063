/**
 * The territory check for uploads and drawn boundaries, and the admin setting behind it
 * (GET/PUT /api/settings/territory). Outside the territory is an error; when swapping the axes
 * would put the parcel inside, the message says the axes look swapped.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import * as territory from '../db/territory';
import { firstOutsideWgs84 } from '../gis/crs';
import { checkGeometry, type ValidationIssue } from '../gis/validate-geometry';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

const pct = (share: number) => `${(share * 100).toFixed(share < 0.995 ? 1 : 0)} %`;

export function territoryIssue(row: { outsideShare: number; swappedInside: boolean }, self: string): ValidationIssue {
  const where = row.outsideShare >= 0.995 ? 'lies outside' : `lies ${pct(row.outsideShare)} outside`;
  return row.swappedInside
    ? {
        code: 'axes-swapped',
        message:
          `${self} ${where} the authority's territory, but with longitude and latitude swapped it lies ` +
          `inside: the axes look swapped (latitude given first). Fix the column order or the CRS axis order and upload again.`,
        severity: 'error',
      }
    : {
        code: 'outside-territory',
        message: `${self} ${where} the authority's territory; check the coordinate reference system, or ask an administrator about the territory setting.`,
        severity: 'error',
      };
}

/** At validation: rejects staged features outside the territory (no check when there is none). */
export async function checkStagedTerritory(
  trx: Db,
  stagingId: string,
): Promise<{ idx: number; issues: ValidationIssue[]; reject: boolean }[]> {
  const t = await territory.effectiveTerritory(trx);
  if (!t.geometry) return [];
  const rows = await territory.stagedOutside(trx, stagingId, t.geometry);
  return rows.map((r) => ({
    idx: r.idx,
    issues: [territoryIssue(r, `Feature ${r.idx + 1}${r.reference ? ` (${r.reference})` : ''}`)],
    reject: true,
  }));
}

/** A drawn or edited boundary outside the territory: 422 naming the problem. */
export async function assertInsideTerritory(trx: Db, geometry: MultiPolygon): Promise<void> {
  const t = await territory.effectiveTerritory(trx);
  if (!t.geometry) return;
  const r = await territory.geometryOutside(trx, geometry, t.geometry);
  if (r.outsideShare <= territory.OUTSIDE_SHARE) return;
  const issue = territoryIssue(r, 'The boundary');
  throw new HttpError('UNPROCESSABLE_CONTENT', issue.message, [{ path: ['geometry'], message: issue.code }]);
}

export async function getTerritory() {
  const t = await territory.effectiveTerritory(db);
  return { territory: t.geometry, source: t.source, defaultMarginDeg: territory.DEFAULT_MARGIN_DEG };
}

/** Stores the territory (a valid WGS 84 Polygon/MultiPolygon) or null for no check; audited. */
export async function putTerritory(by: Caller, value: Polygon | MultiPolygon | null) {
  if (value) {
    const outside = firstOutsideWgs84(value);
    if (outside)
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `Coordinate (${outside[0]}, ${outside[1]}) is not a longitude/latitude in WGS 84.`,
        [{ path: ['territory'], message: 'out of range' }],
      );
    const checked = checkGeometry(value);
    const errors = checked.issues.filter((i) => i.severity === 'error');
    if (!checked.geometry || errors.length)
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `The territory is not a valid polygon: ${errors.map((e) => e.message).join(' ')}`,
        errors.map((e) => ({ path: ['territory'], message: e.message })),
      );
  }
  return withTransaction(db, async (trx) => {
    const before = await territory.storedTerritory(trx);
    await territory.storeTerritory(trx, value, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'settings.territory',
      entityType: 'setting',
      entityId: territory.TERRITORY_KEY,
      details: { before: before.stored ? before.geometry : 'default', after: value },
    });
    const t = await territory.effectiveTerritory(trx);
    return { territory: t.geometry, source: t.source, defaultMarginDeg: territory.DEFAULT_MARGIN_DEG };
  });
}
