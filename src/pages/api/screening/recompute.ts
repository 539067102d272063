import { recomputeScreening } from '~/lib/api/screening';
import { handle } from '~/lib/http/handle';
import { recomputeOnRequest } from '~/lib/services/screening';

export const POST = handle(recomputeScreening, async ({ user }) => recomputeOnRequest(user));
