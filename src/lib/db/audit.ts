/** The audit log: who did what to which record, and when. Every mutation writes one row in its own transaction. */
import type { Db } from './client';

export type AuditEntry = {
  actorId: string | null;
  action: string; // verb.noun, e.g. "user.invite", "factor-set.publish"
  entityType: string;
  entityId: string;
  details?: Record<string, unknown>;
};

export async function recordAudit(db: Db, e: AuditEntry): Promise<void> {
  await db('audit_event').insert({
    actor_id: e.actorId,
    action: e.action,
    entity_type: e.entityType,
    entity_id: e.entityId,
    details: JSON.stringify(e.details ?? {}),
  });
}

export type AuditEvent = AuditEntry & { id: number; at: Date; actorName: string | null };

export async function listAuditEvents(db: Db, opts: { limit: number; beforeId?: number; entityType?: string; entityId?: string }): Promise<AuditEvent[]> {
  const q = db('audit_event as a')
    .leftJoin('user as u', 'u.id', 'a.actor_id')
    .select('a.id', 'a.at', 'a.actor_id', 'a.action', 'a.entity_type', 'a.entity_id', 'a.details', 'u.name as actor_name')
    .orderBy('a.id', 'desc')
    .limit(opts.limit);
  if (opts.beforeId) q.where('a.id', '<', opts.beforeId);
  if (opts.entityType) q.where('a.entity_type', opts.entityType);
  if (opts.entityId) q.where('a.entity_id', opts.entityId);
  const rows = await q;
  return rows.map((r) => ({
    id: r.id,
    at: r.at,
    actorId: r.actor_id,
    actorName: r.actor_name,
    action: r.action,
    entityType: r.entity_type,
    entityId: r.entity_id,
    details: r.details,
  }));
}
