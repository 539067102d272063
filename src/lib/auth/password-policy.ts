/**
 * Password rules (pure; the set-password forms use it too). Length is what matters most
 * (NIST SP 800-63B §5.1.1.2: at least 8, allow at least 64, screen against common and
 * context-specific values); we ask for 10 and refuse the obvious.
 */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

const COMMON = new Set([
  'password', 'password1', 'password12', 'password123', '1234567890', '0123456789', 'qwertyuiop', 'iloveyou12',
  'letmein123', 'welcome123', 'changeme12', 'administrator', 'swardkeep', 'swardkeep1', 'grassland1', 'abcdefghij',
]);

/** Returns a plain-words reason the password is refused, or null when it is acceptable. */
export function passwordProblem(password: string, context: { email?: string; name?: string } = {}): string | null {
  if (password.length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters.`;
  if (password.length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`;
  const lower = password.toLowerCase();
  if (COMMON.has(lower)) return 'This password is too common. Choose another.';
  if (new Set(lower).size < 4) return 'Use more different characters.';
  const local = context.email?.split('@')[0]?.toLowerCase();
  if (local && local.length >= 4 && lower.includes(local)) return 'Do not use your e-mail address in the password.';
  return null;
}
