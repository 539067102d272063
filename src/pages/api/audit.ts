import { listAudit } from '~/lib/api/admin';
import { searchAuditEvents } from '~/lib/db/audit';
import { db } from '~/lib/db/client';
import { handle } from '~/lib/http/handle';

export const GET = handle(listAudit, async ({ query: { page, pageSize, actor, ...f } }) => {
  const { items, total } = await searchAuditEvents(db, { ...f, actorId: actor }, page, pageSize);
  return {
    items: items.map((e) => ({ ...e, at: e.at.toISOString(), details: e.details ?? {} })),
    total,
    page,
    pageSize,
  };
});
