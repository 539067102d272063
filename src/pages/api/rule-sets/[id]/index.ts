import { getRuleSet } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { getRuleSetView } from '~/lib/services/rule-set-views';

export const GET = handle(getRuleSet, async ({ params, query }) => getRuleSetView(params.id, query.version));
