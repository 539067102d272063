import { castVote } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { castVote as vote } from '~/lib/services/board';

export const PUT = handle(castVote, async ({ user, params, body }) => vote(user, params.id, params.itemId, body));
