import { runAssessment } from '~/lib/api/assessments';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { runAssessment as run } from '~/lib/services/assessments';

/** The server's own time goes out as a Server-Timing header (W3C Server Timing), for the benchmark and browsers' tools. */
export const POST = handle(runAssessment, async ({ user, params, body }) => {
  const t0 = performance.now();
  const result = await run(user, params.id, body);
  return json(result, 200, { 'server-timing': `assess;dur=${(performance.now() - t0).toFixed(1)}` });
});
