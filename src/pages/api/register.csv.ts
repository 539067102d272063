import { registerCsv } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { registerCsv as csv } from '~/lib/services/register';

export const GET = handle(
  registerCsv,
  async ({ query, ctx }) =>
    new Response(csv({ ...query, current: query.current === 'true' }, ctx.locals.room), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': 'attachment; filename="register.csv"',
        'cache-control': 'no-store',
      },
    }),
);
