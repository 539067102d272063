/** A failed board request in words; a 409 says that nothing was changed and why. */
import { ApiError } from '../ui/api-client';

export function problemText(e: unknown, fallback: string): string {
  if (!(e instanceof ApiError)) return `${fallback} The server could not be reached; try again.`;
  if (e.status === 409) return `Not done: ${e.message}`;
  if (e.issues.length)
    return `${e.message} ${e.issues
      .map((i) => i.message)
      .filter((m) => !e.message.includes(m))
      .join(' ')}`.trim();
  return e.message;
}
