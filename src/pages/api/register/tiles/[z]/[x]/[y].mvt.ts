import { registerTile } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { registerTileResponse } from '~/lib/services/register';

export const GET = handle(registerTile, async ({ ctx, params, query }) =>
  registerTileResponse(ctx.request, params.z, params.x, params.y, query.v),
);
