import { createMeeting, listMeetings } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { createMeeting as create, listMeetings as list } from '~/lib/services/board';

export const GET = handle(listMeetings, async () => list());
export const POST = handle(createMeeting, async ({ user, body }) => create(user, body));
