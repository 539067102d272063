/**
 * Tile tokens (src/lib/auth/tile-token.ts): HMAC-SHA256 (RFC 2104 / FIPS 198-1) over the user and the
 * expiry, checked in constant time; expiry at the end of the window after the current one (common practice
 * for short-lived signed URLs).
 */
import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { issueTileToken, TILE_TOKEN_WINDOW_MS, verifyTileToken } from '~/lib/auth/tile-token';

const T0 = Date.UTC(2026, 11, 2, 21, 3, 0);

describe('tile tokens', () => {
  it('name the user they were issued to until the end of the next window', () => {
    const token = issueTileToken('user-42', T0);
    expect(verifyTileToken(token, T0)).toBe('user-42');
    const end = (Math.floor(T0 / TILE_TOKEN_WINDOW_MS) + 2) * TILE_TOKEN_WINDOW_MS;
    expect(verifyTileToken(token, end - 1)).toBe('user-42');
    expect(verifyTileToken(token, end)).toBeNull();
  });

  it('are the same within one window, so tile URLs stay cacheable', () => {
    const start = Math.floor(T0 / TILE_TOKEN_WINDOW_MS) * TILE_TOKEN_WINDOW_MS;
    expect(issueTileToken('u', start)).toBe(issueTileToken('u', start + TILE_TOKEN_WINDOW_MS - 1));
    expect(issueTileToken('u', start)).not.toBe(issueTileToken('u', start + TILE_TOKEN_WINDOW_MS));
  });

  it('refuse a changed user, a changed expiry, a changed signature and a key other than ours', () => {
    const [user, exp, mac] = issueTileToken('user-42', T0).split('.') as [string, string, string];
    expect(verifyTileToken(`${Buffer.from('admin-1').toString('base64url')}.${exp}.${mac}`, T0)).toBeNull();
    expect(verifyTileToken(`${user}.${(parseInt(exp, 36) + 60_000).toString(36)}.${mac}`, T0)).toBeNull();
    expect(verifyTileToken(`${user}.${exp}.${mac.slice(0, -1)}${mac.endsWith('A') ? 'B' : 'A'}`, T0)).toBeNull();
    const foreign = createHmac('sha256', 'some other secret').update(`${user}.${exp}`).digest('base64url');
    expect(verifyTileToken(`${user}.${exp}.${foreign}`, T0)).toBeNull();
    expect(verifyTileToken('', T0)).toBeNull();
    expect(verifyTileToken('a.b', T0)).toBeNull();
  });
});
