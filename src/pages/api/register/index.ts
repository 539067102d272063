import { listRegister } from '~/lib/api/register';
import { keptBytesResponse } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { listRegisterJson } from '~/lib/services/register';

export const GET = handle(listRegister, async ({ query }) =>
  keptBytesResponse(await listRegisterJson({ ...query, current: query.current === 'true' }), {
    'content-type': 'application/json; charset=utf-8',
  }),
);
