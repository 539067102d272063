import { runAssessment } from '~/lib/api/assessments';
import { handle } from '~/lib/http/handle';
import { Phases } from '~/lib/http/server-timing';
import { assessmentAnswerBody } from '~/lib/proposals/answer-json';
import { runAssessment as run } from '~/lib/services/assessments';

/**
 * The server's own time until the answer is ready to write goes out as a Server-Timing header (W3C
 * Server Timing), for the benchmark and browsers' tools: `assess` for the whole, then each phase of the
 * run. The JSON text follows in pieces (the request log's `durationMs` covers the time until the last byte
 * is written); they are made at once rather than as the connection drains (`locals.room`): the answer's values are
 * in memory already, and compression then runs beside the making instead of after each piece.
 */
export const POST = handle(runAssessment, async ({ user, params, body }) => {
  const phases = new Phases();
  const result = await run(user, params.id, body, phases);
  return new Response(assessmentAnswerBody(result), {
    status: 200,
    headers: { 'content-type': 'application/json; charset=utf-8', 'server-timing': phases.header('assess') },
  });
});
