import { putDefaultSet } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { setDefaultSet } from '~/lib/services/factor-sets';

export const PUT = handle(putDefaultSet, async ({ user, body }) => setDefaultSet(user, body.id));
