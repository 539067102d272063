/** Server-side guard for .astro pages: sign-in redirect or a 403 page. */
import type { AstroGlobal } from 'astro';
import type { Caller } from '../http/handle';
import { hasAnyRole, type Role } from './roles';

export async function guardPage(Astro: AstroGlobal, roles?: readonly Role[]): Promise<Caller | Response> {
  const user = Astro.locals.user;
  if (!user) return Astro.redirect(`/sign-in?next=${encodeURIComponent(Astro.url.pathname + Astro.url.search)}`);
  if (roles && !hasAnyRole(user.roles, roles)) return Astro.rewrite('/403');
  return user;
}

const NEXT_BASE = 'http://swardkeep.invalid';

/**
 * A post-sign-in destination on this site, or /work. The value is parsed the way a browser parses
 * a URL (WHATWG: tabs and newlines dropped, "\\" read as "/"), so "/\t/host" or "/\\host" cannot
 * turn into "//host"; control characters and backslashes are refused outright.
 */
export function safeNext(next: string | null): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
  if (!next || !next.startsWith('/') || /[\u0000-\u001f\u007f\\]/.test(next)) return '/work';
  let url: URL;
  try {
    url = new URL(next, NEXT_BASE);
  } catch {
    return '/work';
  }
  const path = url.pathname + url.search + url.hash;
  // "/..//host" resolves to the path "//host", which a browser reads as another host.
  if (url.origin !== NEXT_BASE || path.startsWith('//')) return '/work';
  return path;
}
