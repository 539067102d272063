import type { APIRoute } from 'astro';
import { auth } from '~/lib/auth/auth';

/** better-auth's own endpoints (sign-in, sign-out, password reset). Sign-up is disabled. */
export const ALL: APIRoute = (ctx) => {
  // The node adapter passes the client address in no header; rate limiting needs it per client.
  const headers = new Headers(ctx.request.headers);
  headers.set('x-client-ip', ctx.clientAddress);
  return auth.handler(new Request(ctx.request, { headers }));
};
