/**
 * Short-lived tile tokens: the map configuration (`GET /api/map`, signed in) hands out an
 * HMAC-SHA256-signed token that the tile URLs carry (`?t=`), so a tile request is authorised
 * without a session look-up in PostgreSQL. Tiles carry no personal data; a token lives at most
 * two windows (20 minutes), so signing out or losing a role stops tiles within that time.
 * The key is derived from BETTER_AUTH_SECRET, so every instance accepts every instance's tokens.
 * Tokens are the same for one user within one window, so tile URLs (and the browser's cache)
 * stay the same between map configuration requests.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';
import { config } from '../config';

export const TILE_TOKEN_WINDOW_MS = 10 * 60_000;

let key: Buffer | null = null;
const keyOf = () =>
  (key ??= createHmac('sha256', config().BETTER_AUTH_SECRET).update('swardkeep tile token v1').digest());

const sign = (body: string) => createHmac('sha256', keyOf()).update(body).digest('base64url');

/** A token for `userId`, valid until the end of the window after the current one. */
export function issueTileToken(userId: string, now = Date.now()): string {
  const expires = (Math.floor(now / TILE_TOKEN_WINDOW_MS) + 2) * TILE_TOKEN_WINDOW_MS;
  const body = `${Buffer.from(userId).toString('base64url')}.${expires.toString(36)}`;
  return `${body}.${sign(body)}`;
}

/** The user id a valid, unexpired token was issued to; null for anything else. */
export function verifyTileToken(token: string, now = Date.now()): string | null {
  const parts = token.split('.');
  if (parts.length !== 3 || token.length > 300) return null;
  const [user, exp, mac] = parts as [string, string, string];
  const expected = Buffer.from(sign(`${user}.${exp}`));
  const given = Buffer.from(mac);
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
  const expires = parseInt(exp, 36);
  if (!Number.isFinite(expires) || expires <= now) return null;
  return Buffer.from(user, 'base64url').toString();
}
