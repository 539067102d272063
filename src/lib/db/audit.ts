/** The audit log: who did what to which record, and when. Every mutation writes one row in its own transaction. */
import type { Knex } from 'knex';
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

export async function listAuditEvents(
  db: Db,
  opts: { limit: number; beforeId?: number; entityType?: string; entityId?: string },
): Promise<AuditEvent[]> {
  const q = db('audit_event as a')
    .leftJoin('user as u', 'u.id', 'a.actor_id')
    .select(
      'a.id',
      'a.at',
      'a.actor_id',
      'a.action',
      'a.entity_type',
      'a.entity_id',
      'a.details',
      'u.name as actor_name',
    )
    .orderBy('a.id', 'desc')
    .limit(opts.limit);
  if (opts.beforeId) q.where('a.id', '<', opts.beforeId);
  if (opts.entityType) q.where('a.entity_type', opts.entityType);
  if (opts.entityId) q.where('a.entity_id', opts.entityId);
  const rows = await q;
  return rows.map(toEvent);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toEvent(r: any): AuditEvent {
  return {
    id: Number(r.id),
    at: r.at,
    actorId: r.actor_id,
    actorName: r.actor_name,
    action: r.action,
    entityType: r.entity_type,
    entityId: r.entity_id,
    details: r.details,
  };
}

export type AuditFilter = {
  action?: string;
  actorId?: string;
  from?: string;
  to?: string;
  entityType?: string;
  entityId?: string;
};

/** One page of the log, newest first, with the number of entries the filter matches. `from`/`to` are UTC days, both included. */
export async function searchAuditEvents(
  db: Db,
  f: AuditFilter,
  page: number,
  pageSize: number,
): Promise<{ items: AuditEvent[]; total: number }> {
  const where = (q: Knex.QueryBuilder) => {
    if (f.action) q.where('a.action', f.action);
    if (f.actorId === 'system') q.whereNull('a.actor_id');
    else if (f.actorId) q.where('a.actor_id', f.actorId);
    if (f.from) q.where('a.at', '>=', `${f.from}T00:00:00Z`);
    if (f.to) q.whereRaw(`a.at < ((?::date + 1)::timestamp at time zone 'UTC')`, [f.to]);
    if (f.entityType) q.where('a.entity_type', f.entityType);
    if (f.entityId) q.where('a.entity_id', f.entityId);
    return q;
  };
  const [{ count }] = await where(db('audit_event as a')).count<{ count: number }[]>('* as count');
  const rows = await where(
    db('audit_event as a')
      .leftJoin('user as u', 'u.id', 'a.actor_id')
      .select(
        'a.id',
        'a.at',
        'a.actor_id',
        'a.action',
        'a.entity_type',
        'a.entity_id',
        'a.details',
        'u.name as actor_name',
      ),
  )
    .orderBy('a.id', 'desc')
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  return { items: rows.map(toEvent), total: Number(count) };
}

/** The actions and kinds of record the log holds, for the filter's choices. */
export async function auditChoices(db: Db): Promise<{ actions: string[]; entityTypes: string[] }> {
  const [a, t] = await Promise.all([
    db.raw(`select distinct action as v from audit_event order by 1`),
    db.raw(`select distinct entity_type as v from audit_event order by 1`),
  ]);
  return { actions: a.rows.map((x: { v: string }) => x.v), entityTypes: t.rows.map((x: { v: string }) => x.v) };
}
