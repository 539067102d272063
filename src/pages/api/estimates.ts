import { handle } from '~/lib/http/handle';
import { estimateRoute } from '~/lib/http/direct-routes';

// Also served by the direct lane (lib/http/direct-lane.ts) with the same contract and handler.
export const POST = handle(estimateRoute.spec, estimateRoute.run);
