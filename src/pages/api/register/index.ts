import { listRegister } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { sendKept } from '~/lib/http/kept-answer';
import { listRegisterJson } from '~/lib/services/register';

/** Public and the same for everyone: caches may keep it but ask again each time (the ETag changes with the head). */
export const GET = handle(listRegister, async ({ ctx, query }) =>
  sendKept(ctx.request, await listRegisterJson({ ...query, current: query.current === 'true' }), {
    'content-type': 'application/json; charset=utf-8',
    'cache-control': 'public, no-cache',
  }),
);
