import { parcelsForSnapping } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { parcelsForSnapping as boundaries } from '~/lib/services/map';

export const GET = handle(parcelsForSnapping, async ({ query }) => boundaries(query.bbox));
