import { reorderItems } from '~/lib/api/board-pack';
import { handle } from '~/lib/http/handle';
import { reorderAgenda } from '~/lib/services/board-agenda';

export const PUT = handle(reorderItems, async ({ user, params, body }) => reorderAgenda(user, params.id, body));
