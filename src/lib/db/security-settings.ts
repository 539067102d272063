/** Reads the sign-in security settings from app_setting on every call (no process cache: instances must agree). */
import { readSecuritySettings, SECURITY_SETTING_KEYS, type SecuritySettings } from '../auth/security-settings';
import type { Db } from './client';

export async function getSecuritySettings(db: Db): Promise<SecuritySettings> {
  const rows = await db('app_setting').select('key', 'value').whereIn('key', SECURITY_SETTING_KEYS);
  return readSecuritySettings(rows);
}
