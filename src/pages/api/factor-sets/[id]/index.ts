import { getFactorSet } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { getSetView } from '~/lib/services/factor-set-views';

export const GET = handle(getFactorSet, async ({ params, query }) => getSetView(params.id, query.version));
