import { createEstimate } from '~/lib/api/estimates';
import { handle } from '~/lib/http/handle';
import { runEstimate } from '~/lib/services/estimates';

export const POST = handle(createEstimate, async ({ body }) => runEstimate(body));
