import { listAudit } from '~/lib/api/admin';
import { listAuditEvents } from '~/lib/db/audit';
import { db } from '~/lib/db/client';
import { handle } from '~/lib/http/handle';

export const GET = handle(listAudit, async ({ query }) => {
  const events = await listAuditEvents(db, { limit: query.limit, beforeId: query.before, entityType: query.entityType, entityId: query.entityId });
  return { items: events.map((e) => ({ ...e, at: e.at.toISOString(), details: e.details ?? {} })) };
});
