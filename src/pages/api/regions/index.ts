import { listRegions } from '~/lib/api/regions';
import { handle } from '~/lib/http/handle';
import { regionOverview } from '~/lib/services/regions';

export const GET = handle(listRegions, async ({ query }) =>
  regionOverview(query.asOf ?? new Date().toISOString().slice(0, 10)),
);
