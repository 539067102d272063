import { searchParcels } from '~/lib/api/parcels';
import { db } from '~/lib/db/client';
import { searchParcels as search } from '~/lib/db/parcels';
import { handle } from '~/lib/http/handle';

export const GET = handle(searchParcels, async ({ query }) => ({
  items: (await search(db, query.q, 20)).map((r) => ({
    id: r.id,
    reference: r.reference,
    name: r.name,
    areaHa: r.area_ha,
  })),
}));
