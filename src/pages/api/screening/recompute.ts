import { recomputeScreening } from '~/lib/api/screening';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { Phases } from '~/lib/http/server-timing';
import { recomputeOnRequest } from '~/lib/services/screening';

/** Server-Timing (W3C Server Timing): `screening` for the whole, then each phase, for the benchmark and browsers' tools. */
export const POST = handle(recomputeScreening, async ({ user }) => {
  const phases = new Phases();
  const result = await recomputeOnRequest(user, phases);
  return json(result, 200, { 'server-timing': phases.header('screening') });
});
