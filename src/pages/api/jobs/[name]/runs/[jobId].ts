import { getJobRun } from '~/lib/api/jobs';
import { HttpError } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { jobRun } from '~/lib/jobs/queue';

export const GET = handle(getJobRun, async ({ params }) => {
  const run = await jobRun(params.name, params.jobId);
  if (!run) throw new HttpError('NOT_FOUND', `No run ${params.jobId} of ${params.name}.`);
  return run;
});
