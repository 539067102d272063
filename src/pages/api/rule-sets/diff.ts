import { diffRuleSets } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { diffRuleSetVersions } from '~/lib/services/rule-set-views';

export const GET = handle(diffRuleSets, async ({ query }) => diffRuleSetVersions(query.a, query.b));
