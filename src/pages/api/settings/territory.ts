import { getTerritory as getSpec, putTerritory as putSpec } from '~/lib/api/territory';
import { handle } from '~/lib/http/handle';
import { getTerritory, putTerritory } from '~/lib/services/territory';

export const GET = handle(getSpec, async () => getTerritory());
export const PUT = handle(putSpec, async ({ user, body }) => putTerritory(user, body.territory));
