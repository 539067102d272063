import { publishRuleDraft } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { publishRuleDraft as publish } from '~/lib/services/rule-sets';

export const POST = handle(publishRuleDraft, async ({ user, params, body }) => publish(user, params.id, body));
