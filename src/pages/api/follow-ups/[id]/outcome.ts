import { recordFollowUpOutcome } from '~/lib/api/follow-ups';
import { handle } from '~/lib/http/handle';
import { recordOutcome } from '~/lib/services/follow-ups';

export const POST = handle(recordFollowUpOutcome, async ({ user, params, body }) =>
  recordOutcome(user, params.id, body),
);
