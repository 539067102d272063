import { runAssessment } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { Phases } from '~/lib/http/server-timing';
import { assessmentAnswerJson } from '~/lib/proposals/answer-json';
import { runAssessment as run } from '~/lib/services/assessments';

/**
 * The server's own time goes out as a Server-Timing header (W3C Server Timing), for the benchmark
 * and browsers' tools: `assess` for the whole, then each phase of the run and the JSON text.
 */
export const POST = handle(runAssessment, async ({ user, params, body }) => {
  const phases = new Phases();
  const result = await run(user, params.id, body, phases);
  const text = assessmentAnswerJson(result);
  phases.mark('json');
  return new Response(text, {
    status: 200,
    headers: { 'content-type': 'application/json; charset=utf-8', 'server-timing': phases.header('assess') },
  });
});
