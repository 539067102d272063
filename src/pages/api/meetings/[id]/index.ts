import { getMeeting } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { meetingDetail } from '~/lib/services/board';

export const GET = handle(getMeeting, async ({ params }) => meetingDetail(params.id));
