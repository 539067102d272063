import { registerGeoJson } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { registerGeoJson as geojson } from '~/lib/services/register';

export const GET = handle(
  registerGeoJson,
  async ({ query, ctx }) =>
    new Response(geojson({ ...query, current: query.current === 'true' }, ctx.locals.room), {
      headers: {
        'content-type': 'application/geo+json',
        'content-disposition': 'attachment; filename="register.geojson"',
        'cache-control': 'no-store',
      },
    }),
);
