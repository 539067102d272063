import { getItemPack } from '~/lib/api/board-pack';
import { handle } from '~/lib/http/handle';
import { itemPack } from '~/lib/services/board-pack';

export const GET = handle(getItemPack, async ({ params }) => itemPack(params.id, params.itemId));
