import { acceptInvitation } from '~/lib/api/users';
import { handle } from '~/lib/http/handle';
import { acceptInvitation as accept } from '~/lib/services/invitations';

export const POST = handle(acceptInvitation, async ({ body }) => accept(body));
