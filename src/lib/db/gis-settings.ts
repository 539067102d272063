/** Reads the GIS settings from app_setting on every call (no process cache: instances must agree). */
import { GIS_SETTING_KEYS, readGisSettings, type GisSettings } from '../gis/settings';
import type { Db } from './client';

export async function getGisSettings(db: Db): Promise<GisSettings> {
  const rows = await db('app_setting').select('key', 'value').whereIn('key', GIS_SETTING_KEYS);
  return readGisSettings(rows);
}
