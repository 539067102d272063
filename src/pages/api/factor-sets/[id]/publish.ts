import { publishDraft } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { publishDraft as publish } from '~/lib/services/factor-sets';

export const POST = handle(publishDraft, async ({ user, params, body }) => publish(user, params.id, body.note));
