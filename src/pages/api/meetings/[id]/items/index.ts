import { addMeetingItem } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { addItem } from '~/lib/services/board';

export const POST = handle(addMeetingItem, async ({ user, params, body }) => addItem(user, params.id, body.proposalId));
