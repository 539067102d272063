/**
 * Which methods an API path answers, from the route contracts (lib/api/index.ts): the
 * middleware gives unknown API paths a JSON 404 and a wrong method 405 with Allow.
 */
import { allSpecs } from '../api';

const routes = allSpecs
  .filter((s) => !s.path.startsWith('/api/auth/')) // better-auth's: lib/auth/endpoints.ts answers for them
  .map((s) => ({
    method: s.method as string,
    multipart: !!s.multipart,
    pattern: new RegExp(`^${s.path.replace(/[.]/g, '\\.').replace(/\{[^}]+\}/g, '[^/]+')}/?$`),
  }));

export type ApiRouteMatch = { allowed: string[]; multipart: boolean } | null;

/** The routes whose pattern matches `pathname`. */
const matching = (pathname: string) => routes.filter((r) => r.pattern.test(pathname));

/** The answer for each path without parameters (and with a trailing slash), worked out once. */
const fixed = new Map(
  allSpecs
    .filter((s) => !s.path.includes('{'))
    .flatMap((s) => [s.path, `${s.path}/`])
    .map((p) => [p, matching(p)]),
);

/** The methods the path answers (HEAD with GET), or null for no such API path. */
export function matchApiRoute(pathname: string, method: string): ApiRouteMatch {
  const found = fixed.get(pathname) ?? matching(pathname);
  if (found.length === 0) return null;
  const allowed = [...new Set(found.flatMap((r) => (r.method === 'GET' ? ['GET', 'HEAD'] : [r.method])))];
  const multipart = found.some((r) => r.multipart && r.method === method);
  return { allowed, multipart };
}
