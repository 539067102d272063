import { listAssessments } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { listAssessments as list } from '~/lib/services/assessments';

export const GET = handle(listAssessments, async ({ params }) => list(params.id));
