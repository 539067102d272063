/** Contracts of the admin-only read routes: the audit log and the captured-mail box. */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

const pageQuery = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: z.coerce.number().int().positive().optional(),
});

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give a date as YYYY-MM-DD.')
  .refine(
    (v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v),
    'No such day.',
  );

/** Filters and paging of the audit log, applied by the database. */
export const auditQuery = z.object({
  action: z.string().max(60).optional().describe('Exact action, e.g. user.update'),
  actor: z.string().max(100).optional().describe('User id of whoever acted, or "system"'),
  from: day.optional().describe('First day (UTC) included'),
  to: day.optional().describe('Last day (UTC) included'),
  entityType: z.string().max(50).optional().describe('Kind of record, e.g. user, proposal'),
  entityId: z.string().max(100).optional().describe('The record’s id'),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

export const listAudit = defineSpec({
  method: 'GET',
  path: '/api/audit',
  tag: 'Admin',
  summary: 'Audit log, newest first, filtered and paged',
  access: ['admin'],
  query: auditQuery,
  response: z.object({
    items: z.array(
      z.object({
        id: z.number(),
        at: z.string(),
        actorId: z.string().nullable(),
        actorName: z.string().nullable(),
        action: z.string(),
        entityType: z.string(),
        entityId: z.string(),
        details: z.record(z.string(), z.unknown()),
      }),
    ),
    total: z.number().int().describe('Entries matching the filter'),
    page: z.number().int(),
    pageSize: z.number().int(),
  }),
});

export const listCapturedMail = defineSpec({
  method: 'GET',
  path: '/api/mail/captured',
  tag: 'Admin',
  summary: 'Mail received by the local SMTP fake (development and demo)',
  access: ['admin'],
  query: pageQuery.extend({ to: z.string().max(200).optional() }),
  response: z.object({
    items: z.array(
      z.object({
        id: z.number(),
        receivedAt: z.string(),
        from: z.string(),
        to: z.array(z.string()),
        subject: z.string(),
        text: z.string(),
      }),
    ),
  }),
});

export const health = defineSpec({
  method: 'GET',
  path: '/api/health',
  tag: 'System',
  summary: 'Liveness and database check for the load balancer',
  access: 'public',
  response: z.object({ ok: z.boolean(), database: z.boolean() }),
});

export const ready = defineSpec({
  method: 'GET',
  path: '/api/ready',
  tag: 'System',
  summary: 'Readiness for traffic: the database answers and its migrations are current (503 with the reason otherwise)',
  access: 'public',
  response: z.object({
    ready: z.literal(true),
    database: z.literal(true),
    migrations: z.object({ applied: z.number().int(), pending: z.number().int() }),
  }),
});

export const openapi = defineSpec({
  method: 'GET',
  path: '/api/openapi.json',
  tag: 'System',
  summary: 'This OpenAPI document',
  access: 'public',
  response: z.record(z.string(), z.unknown()),
});
