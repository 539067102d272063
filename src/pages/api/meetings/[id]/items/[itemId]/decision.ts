import { recordDecision } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { recordDecision as decide } from '~/lib/services/board';

export const POST = handle(recordDecision, async ({ user, params, body }) =>
  decide(user, params.id, params.itemId, body),
);
