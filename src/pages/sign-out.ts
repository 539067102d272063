import type { APIRoute } from 'astro';
import { auth } from '~/lib/auth/auth';
import { recordAudit } from '~/lib/db/audit';
import { db } from '~/lib/db/client';

/** Plain form POST from the header, so signing out works without JavaScript. */
export const POST: APIRoute = async (ctx) => {
  const headers = new Headers({ location: '/' });
  if (ctx.locals.user) {
    const res = await auth.api.signOut({ headers: ctx.request.headers, asResponse: true });
    for (const c of res.headers.getSetCookie()) headers.append('set-cookie', c);
    const { id } = ctx.locals.user;
    if (res.ok)
      await recordAudit(db, {
        actorId: id,
        action: 'user.sign-out',
        entityType: 'user',
        entityId: id,
        details: { ip: ctx.clientAddress },
      });
  }
  return new Response(null, { status: 303, headers });
};
