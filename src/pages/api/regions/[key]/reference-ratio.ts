import { enterReferenceRatio } from '~/lib/api/regions';
import { handle } from '~/lib/http/handle';
import { enterReferenceRatio as enter } from '~/lib/services/regions';

export const POST = handle(enterReferenceRatio, async ({ user, params, body }) => enter(user, params.key, body));
