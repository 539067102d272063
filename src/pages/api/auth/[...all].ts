import type { APIRoute } from 'astro';
import { serveAuth } from '~/lib/auth/endpoints';

/** better-auth's endpoints that Swardkeep uses (sign-in, sign-out, session, password reset); all others answer 404. */
export const ALL: APIRoute = (ctx) => serveAuth(ctx.request, ctx.clientAddress);
