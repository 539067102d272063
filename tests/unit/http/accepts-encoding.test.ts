/** Accept-Encoding as RFC 9110 §12.5.3 reads it: q=0 refuses a coding, `*` stands for codings not named. */
import { describe, expect, it } from 'vitest';
import { acceptsEncoding } from '../../../src/lib/http/kept-answer';

describe('acceptsEncoding (RFC 9110 §12.5.3)', () => {
  it('accepts a named coding unless its weight is 0', () => {
    expect(acceptsEncoding('gzip, deflate, br', 'br')).toBe(true);
    expect(acceptsEncoding('gzip;q=0.5, br;q=0', 'br')).toBe(false);
    expect(acceptsEncoding('gzip;q=0.5, br;q=0', 'gzip')).toBe(true);
    expect(acceptsEncoding('GZIP', 'gzip')).toBe(true);
  });

  it('reads * as any coding not named, and nothing as no compression', () => {
    expect(acceptsEncoding('*', 'br')).toBe(true);
    expect(acceptsEncoding('gzip;q=0, *', 'gzip')).toBe(false);
    expect(acceptsEncoding('*;q=0', 'br')).toBe(false);
    expect(acceptsEncoding('identity', 'gzip')).toBe(false);
    expect(acceptsEncoding('', 'gzip')).toBe(false);
    expect(acceptsEncoding(null, 'br')).toBe(false);
  });
});
