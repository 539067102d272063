import type { APIRoute } from 'astro';
import { auth } from '~/lib/auth/auth';

/** Plain form POST from the header, so signing out works without JavaScript. */
export const POST: APIRoute = async (ctx) => {
  const headers = new Headers({ location: '/' });
  if (ctx.locals.user) {
    const res = await auth.api.signOut({ headers: ctx.request.headers, asResponse: true });
    for (const c of res.headers.getSetCookie()) headers.append('set-cookie', c);
  }
  return new Response(null, { status: 303, headers });
};
