import { updateUser } from '~/lib/api/users';
import { handle } from '~/lib/http/handle';
import { changeUser } from '~/lib/services/users';

export const PATCH = handle(updateUser, async ({ user, params, body: { version, ...patch } }) =>
  changeUser(user, params.id, version, patch),
);
