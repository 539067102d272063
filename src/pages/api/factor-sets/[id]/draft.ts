import { editDraft, startDraft } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { editDraftEntry, startDraft as start } from '~/lib/services/factor-sets';

export const POST = handle(startDraft, async ({ user, params }) => start(user, params.id));

export const PATCH = handle(editDraft, async ({ user, params, body }) => editDraftEntry(user, params.id, body));
