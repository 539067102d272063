import { getAssessment, saveFindings } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { assessmentAnswerBody } from '~/lib/proposals/answer-json';
import { getAssessment as get, saveFindings as save } from '~/lib/services/assessments';

export const GET = handle(
  getAssessment,
  async ({ params }) =>
    new Response(assessmentAnswerBody(await get(params.id)), {
      status: 200,
      headers: { 'content-type': 'application/json; charset=utf-8' },
    }),
);
export const PATCH = handle(saveFindings, async ({ user, params, body }) => save(user, params.id, body));
