import { editBoundary } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { editBoundary as edit } from '~/lib/services/parcels';

export const PUT = handle(editBoundary, async ({ user, params, body }) => edit(user, params.id, body));
