/** Contracts of the job queue's admin routes. */
import { z } from 'zod';
import { defineSpec } from '../http/spec';
import { JOB_NAMES } from '../jobs/names';

const nameParams = z.object({ name: z.enum(JOB_NAMES) });

export const runJobNow = defineSpec({
  method: 'POST',
  path: '/api/jobs/{name}/run',
  tag: 'Jobs',
  summary: 'Queue a run of a timed job now (it runs on whichever instance picks it up); returns the job id',
  access: ['admin'],
  params: nameParams,
  response: z.object({ jobId: z.string(), name: z.enum(JOB_NAMES) }),
  status: 202,
});

export const getJobRun = defineSpec({
  method: 'GET',
  path: '/api/jobs/{name}/runs/{jobId}',
  tag: 'Jobs',
  summary: 'State of one queued run: created, active, completed (with what it did), retry or failed',
  access: ['admin'],
  params: nameParams.extend({ jobId: z.uuid('Job ids are UUIDs.') }),
  response: z.object({
    id: z.string(),
    name: z.string(),
    state: z.string(),
    createdOn: z.string(),
    startedOn: z.string().nullable(),
    completedOn: z.string().nullable(),
    output: z.unknown(),
  }),
});
