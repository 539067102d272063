import { runJobNow } from '~/lib/api/jobs';
import { recordAudit } from '~/lib/db/audit';
import { db } from '~/lib/db/client';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { queueRunNow } from '~/lib/jobs/queue';

export const POST = handle(runJobNow, async ({ user, params }) => {
  const jobId = await queueRunNow(params.name, user.id);
  await recordAudit(db, {
    actorId: user.id,
    action: 'job.run-now',
    entityType: 'job',
    entityId: params.name,
    details: { jobId },
  });
  return json({ jobId, name: params.name }, 202);
});
