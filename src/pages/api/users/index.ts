import { inviteUser, listUsers } from '~/lib/api/users';
import { db } from '~/lib/db/client';
import { listUsers as readUsers } from '~/lib/db/users';
import { handle } from '~/lib/http/handle';
import { inviteUser as invite } from '~/lib/services/invitations';

export const GET = handle(listUsers, async () => ({ items: await readUsers(db) }));

export const POST = handle(inviteUser, async ({ user, body }) => invite(user, body));
