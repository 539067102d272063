import { editRuleDraft, startRuleDraft } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { editRuleDraft as edit, startRuleDraft as start } from '~/lib/services/rule-sets';

export const POST = handle(startRuleDraft, async ({ user, params }) => start(user, params.id));

export const PATCH = handle(editRuleDraft, async ({ user, params, body }) => edit(user, params.id, body));
