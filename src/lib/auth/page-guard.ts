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

/** Only same-site relative paths may be used as a post-sign-in destination. */
export function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/work';
}
