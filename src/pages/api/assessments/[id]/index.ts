import { getAssessment, saveFindings } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { getAssessment as get, saveFindings as save } from '~/lib/services/assessments';

export const GET = handle(getAssessment, async ({ params }) => get(params.id));
export const PATCH = handle(saveFindings, async ({ user, params, body }) => save(user, params.id, body));
