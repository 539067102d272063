import { getDashboard } from '~/lib/api/dashboard';
import { handle } from '~/lib/http/handle';
import { dashboard } from '~/lib/services/dashboard';

export const GET = handle(getDashboard, async () => dashboard());
