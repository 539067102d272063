import { reproduceAssessment } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { reproduceAssessment as reproduce } from '~/lib/services/assessments';

export const GET = handle(reproduceAssessment, async ({ params }) => reproduce(params.id));
