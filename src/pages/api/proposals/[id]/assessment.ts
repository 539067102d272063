import { runAssessment } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { runAssessment as run } from '~/lib/services/assessments';

export const POST = handle(runAssessment, async ({ user, params, body }) => run(user, params.id, body));
