import { putDefaultRuleSet } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { setDefaultRuleSet } from '~/lib/services/rule-sets';

export const PUT = handle(putDefaultRuleSet, async ({ user, body }) => setDefaultRuleSet(user, body.id));
