import { confirmTable } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { confirmTable as confirm } from '~/lib/services/factor-sets';

export const POST = handle(confirmTable, async ({ user, params, body }) =>
  confirm(user, params.id, params.version, body),
);
