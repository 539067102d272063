import { declareConflict } from '~/lib/api/board';
import { handle } from '~/lib/http/handle';
import { declareConflict as declare } from '~/lib/services/board';

export const POST = handle(declareConflict, async ({ user, params, body }) =>
  declare(user, params.id, params.itemId, body.reason),
);
