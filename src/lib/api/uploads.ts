/** Contracts of the upload routes: stage (multipart), validate, save, cancel; and the CRS picker. */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

const idParams = z.object({ id: z.uuid('Upload ids are UUIDs.') });
const issue = z.object({ code: z.string(), message: z.string(), severity: z.string() });
const crs = z.object({ epsg: z.number().int().nullable(), name: z.string(), source: z.string() });

export const stageUpload = defineSpec({
  method: 'POST',
  path: '/api/uploads',
  tag: 'Uploads',
  summary:
    'Upload a zipped shapefile or GeoJSON (multipart: file, purpose=parcels|reference); returns its layers, columns with samples and detected CRS',
  access: ['planner', 'admin'],
  multipart: true,
  response: z.object({
    id: z.string(),
    purpose: z.enum(['parcels', 'reference']),
    fileName: z.string(),
    format: z.string(),
    sizeBytes: z.number(),
    sha256: z.string(),
    expiresAt: z.string(),
    layers: z.array(
      z.object({
        name: z.string(),
        featureCount: z.number(),
        geometryType: z.string(),
        columns: z.array(z.object({ name: z.string(), kind: z.string(), samples: z.array(z.string()) })),
        crs: crs.nullable(),
        crsNote: z.string().nullable(),
        rememberedMapping: z.record(z.string(), z.unknown()).nullable(),
      }),
    ),
    timings: z.object({ parseMs: z.number() }),
  }),
  status: 201,
});

export const validateUpload = defineSpec({
  method: 'POST',
  path: '/api/uploads/{id}/validation',
  tag: 'Uploads',
  summary: 'Validate a staged upload with a layer, column mapping and (when needed) an EPSG code: per-feature report',
  access: ['planner', 'admin'],
  params: idParams,
  body: z.object({
    layer: z.string().min(1).max(200),
    epsg: z.number().int().positive().optional(),
    mapping: z.record(z.string(), z.unknown()),
  }),
  response: z.object({
    id: z.string(),
    layer: z.string(),
    crs,
    summary: z.object({
      total: z.number(),
      ok: z.number(),
      repaired: z.number(),
      rejected: z.number(),
      byCode: z.record(z.string(), z.number()),
    }),
    features: z.array(
      z.object({
        index: z.number(),
        reference: z.string().nullable(),
        status: z.string(),
        issues: z.array(issue),
        areaHa: z.number().nullable(),
      }),
    ),
    omitted: z.number(),
    timings: z.object({ parseMs: z.number(), validateMs: z.number() }),
  }),
});

export const saveUpload = defineSpec({
  method: 'POST',
  path: '/api/uploads/{id}/save',
  tag: 'Uploads',
  summary: 'Save the valid features of a validated upload (one transaction: batch, parcels, history, overlay)',
  access: ['planner', 'admin'],
  params: idParams,
  response: z.object({
    batchId: z.string(),
    purpose: z.string(),
    saved: z.number(),
    rejected: z.number(),
    referenceVersion: z.object({ id: z.number(), kind: z.string(), version: z.number() }).nullable(),
    timings: z.object({ storeMs: z.number(), overlayMs: z.number() }),
  }),
  status: 201,
});

export const uploadReportCsv = defineSpec({
  method: 'GET',
  path: '/api/uploads/{id}/report.csv',
  tag: 'Uploads',
  summary:
    'The full validation report of a staged upload as CSV (every feature with its status, measured area and each remark in words)',
  access: ['planner', 'admin'],
  params: idParams,
  response: null,
  responseType: 'text/csv',
});

export const cancelUpload = defineSpec({
  method: 'DELETE',
  path: '/api/uploads/{id}',
  tag: 'Uploads',
  summary: 'Cancel a staged upload (nothing is kept)',
  access: ['planner', 'admin'],
  params: idParams,
  response: null,
  status: 204,
});

export const searchCrs = defineSpec({
  method: 'GET',
  path: '/api/crs',
  tag: 'Uploads',
  summary: 'Search the shipped EPSG catalogue by code or words (national grids and UTM zones first)',
  access: 'signed-in',
  query: z.object({
    q: z.string().trim().min(1, 'Type a code or a name.').max(100),
    limit: z.coerce.number().int().min(1).max(50).default(20),
  }),
  response: z.object({
    items: z.array(z.object({ epsg: z.number(), name: z.string(), kind: z.string(), areaOfUse: z.string() })),
  }),
});

const phase = z.enum([
  'reading',
  'staged',
  'checking',
  'keeping',
  'comparing',
  'validated',
  'storing',
  'overlay',
  'saved',
  'failed',
  'cancelled',
]);

export const uploadStatus = defineSpec({
  method: 'GET',
  path: '/api/uploads/{id}',
  tag: 'Uploads',
  summary:
    'Where an upload stands, stored in the database (phase, counts done/total where known, times): the staged layers, ' +
    'the last check’s choices and report, or what the save did; for the uploader and administrators (404 for others)',
  access: ['planner', 'admin'],
  params: idParams,
  response: z.object({
    id: z.string(),
    purpose: z.enum(['parcels', 'reference']),
    fileName: z.string(),
    state: z.enum(['running', 'staged', 'validated', 'saved', 'failed', 'cancelled', 'expired']),
    phase,
    failedIn: phase.nullable(),
    done: z.number().nullable(),
    total: z.number().nullable(),
    startedAt: z.string(),
    phaseStartedAt: z.string(),
    updatedAt: z.string(),
    message: z.string().nullable(),
    staged: z.record(z.string(), z.unknown()).nullable(),
    choice: z
      .object({ layer: z.string(), epsg: z.number().nullable(), mapping: z.record(z.string(), z.unknown()) })
      .nullable(),
    report: z.record(z.string(), z.unknown()).nullable(),
    saved: z
      .object({
        batchId: z.string(),
        purpose: z.string(),
        saved: z.number(),
        rejected: z.number(),
        referenceVersion: z.object({ id: z.number(), kind: z.string(), version: z.number() }).nullable(),
      })
      .nullable(),
  }),
});
