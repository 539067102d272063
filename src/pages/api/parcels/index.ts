import { drawParcel } from '~/lib/api/parcels';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { drawParcel as draw } from '~/lib/services/parcels';

export const POST = handle(drawParcel, async ({ user, body }) => json(await draw(user, body), 201));
