import { me } from '~/lib/api/users';
import { handle } from '~/lib/http/handle';

export const GET = handle(me, async ({ user }) => user);
