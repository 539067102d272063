/** The pure rules behind sign-in security: back-off, safe post-sign-in destinations, the password policy. */
import { describe, expect, it } from 'vitest';
import { safeNext } from '~/lib/auth/page-guard';
import { passwordProblem } from '~/lib/auth/password-policy';
import { backOffSeconds, readSecuritySettings } from '~/lib/auth/security-settings';

const defaults = readSecuritySettings([]);

describe('back-off after failed sign-ins', () => {
  const now = 1_000_000_000;
  it('costs nothing within the free allowance, then doubles from the first delay up to the cap (common practice: exponential back-off)', () => {
    expect(backOffSeconds(4, now, now, 5, defaults)).toBe(0);
    expect([5, 6, 7, 8, 9, 10, 11, 20].map((n) => backOffSeconds(n, now, now, 5, defaults))).toEqual([
      30, 60, 120, 240, 480, 900, 900, 900,
    ]);
  });
  it('counts the wait from the newest failure', () => {
    expect(backOffSeconds(5, now - 20_000, now, 5, defaults)).toBe(10);
    expect(backOffSeconds(5, now - 31_000, now, 5, defaults)).toBe(0);
  });
  it('reads other stored values and refuses nonsense with the key named', () => {
    const s = readSecuritySettings([{ key: 'auth.throttle.first-delay-seconds', value: 10 }]);
    expect(backOffSeconds(5, now, now, 5, s)).toBe(10);
    expect(() => readSecuritySettings([{ key: 'auth.session.idle-minutes', value: 0 }])).toThrow(
      /auth.session.idle-minutes/,
    );
    expect(defaults['auth.session.idle-minutes']).toBe(480);
  });
});

describe('post-sign-in destination', () => {
  // WHATWG URL Standard: tab and newline are removed while parsing, "\" counts as "/" in special URLs.
  it.each([
    '/\t/evil.example',
    '//evil.example',
    '/\\evil.example',
    '/..//evil.example',
    'https://evil.example',
    '/a\nb',
    '',
    null,
  ])('%j goes to /work', (next) => {
    expect(safeNext(next as string | null)).toBe('/work');
  });
  it('keeps same-site paths with query and fragment', () => {
    expect(safeNext('/calculator?x=1#y')).toBe('/calculator?x=1#y');
    expect(safeNext('/work/assessor')).toBe('/work/assessor');
    // Still encoded, %09 is part of a path on this site, not a tab a browser would strip.
    expect(safeNext('/%09/evil.example')).toBe('/%09/evil.example');
  });
});

describe('password policy', () => {
  // Examples of guessable passwords are common practice (NIST SP 800-63B §5.1.1.2: refuse commonly used, expected or compromised values).
  it.each(['Password1!', 'password123', 'aaaaaaaaaa', '1234567890', 'qwertyuiop'])('%j is refused', (p) => {
    expect(passwordProblem(p)).toMatch(/too common|too easy to guess/);
  });
  it('refuses a password made of the person’s own name or address', () => {
    expect(passwordProblem('sorrelpia2026', { email: 'pia.sorrel@tarrow.example', name: 'Pia Sorrel' })).toMatch(
      /your name/,
    );
  });
  it('accepts a sentence of ordinary words and explains length first', () => {
    expect(passwordProblem('lark over the wet meadow')).toBeNull();
    expect(passwordProblem('short')).toMatch(/at least 10/);
  });
});
