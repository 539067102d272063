import { transitionProposal } from '~/lib/api/proposals';
import { handle } from '~/lib/http/handle';
import { transitionProposal as transition } from '~/lib/services/proposals';

export const POST = handle(transitionProposal, async ({ user, params, body }) => transition(user, params.id, body));
