import { getFollowUp } from '~/lib/api/follow-ups';
import { handle } from '~/lib/http/handle';
import { followUpDetail } from '~/lib/services/follow-ups';

export const GET = handle(getFollowUp, async ({ params }) => followUpDetail(params.id));
