import { signOffAssessment } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { signOff } from '~/lib/services/assessments';

export const POST = handle(signOffAssessment, async ({ user, params, body }) => signOff(user, params.id, body));
