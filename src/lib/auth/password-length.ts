/** The length part of the password policy (pure and light: the set-password forms import it). */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

export function passwordLengthProblem(password: string): string | null {
  if (password.length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters.`;
  if (password.length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`;
  return null;
}
