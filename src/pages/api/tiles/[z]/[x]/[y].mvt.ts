import { tile } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { tileResponse } from '~/lib/services/map';

export const GET = handle(tile, async ({ ctx, params, query }) =>
  tileResponse(ctx.request, params.z, params.x, params.y, query.v),
);
