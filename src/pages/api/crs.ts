import { searchCrs } from '~/lib/api/uploads';
import { searchCrs as search } from '~/lib/gis/crs-catalogue.server';
import { handle } from '~/lib/http/handle';

export const GET = handle(searchCrs, async ({ query }) => ({ items: await search(query.q, query.limit) }));
