import { reinviteUser } from '~/lib/api/users';
import { handle } from '~/lib/http/handle';
import { reinviteUser as reinvite } from '~/lib/services/invitations';

export const POST = handle(reinviteUser, async ({ user, params }) => reinvite(user, params.id));
