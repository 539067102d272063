import { createProposal, listProposals } from '~/lib/api/proposals';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { createProposal as create, listProposals as list } from '~/lib/services/proposals';

export const GET = handle(listProposals, async ({ query }) => list(query));
export const POST = handle(createProposal, async ({ user, body }) => json(await create(user, body), 201));
