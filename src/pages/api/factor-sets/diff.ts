import { diffFactorSets } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { diffVersions } from '~/lib/services/factor-set-views';

export const GET = handle(diffFactorSets, async ({ query }) => diffVersions(query.a, query.b));
