import { getProposal, updateProposal } from '~/lib/api/proposals';
import { handle } from '~/lib/http/handle';
import { proposalDetail, updateProposal as update } from '~/lib/services/proposals';

export const GET = handle(getProposal, async ({ user, params }) => proposalDetail(user, params.id));
export const PATCH = handle(updateProposal, async ({ user, params, body }) => update(user, params.id, body));
