import { listRegister } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { listRegisterJson } from '~/lib/services/register';

export const GET = handle(
  listRegister,
  async ({ query }) =>
    new Response(await listRegisterJson({ ...query, current: query.current === 'true' }), {
      headers: { 'content-type': 'application/json; charset=utf-8' },
    }),
);
