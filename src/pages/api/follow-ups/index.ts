import { listFollowUps } from '~/lib/api/follow-ups';
import { handle } from '~/lib/http/handle';
import { listFollowUps as list } from '~/lib/services/follow-ups';

export const GET = handle(listFollowUps, async ({ query }) =>
  list({ ...query, overdue: query.overdue === undefined ? undefined : query.overdue === 'true' }),
);
