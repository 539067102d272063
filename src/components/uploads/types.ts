/** Shapes of the upload API answers, as the wizard reads them. */
export type Column = { name: string; kind: string; samples: string[] };
export type StagedLayer = {
  name: string;
  featureCount: number;
  geometryType: string;
  columns: Column[];
  crs: { epsg: number | null; name: string; source: string } | null;
  crsNote: string | null;
  rememberedMapping: Record<string, unknown> | null;
};
export type Staged = {
  id: string;
  purpose: 'parcels' | 'reference';
  fileName: string;
  format: string;
  sizeBytes: number;
  sha256: string;
  expiresAt: string;
  layers: StagedLayer[];
  timings?: { parseMs: number };
};
export type Issue = { code: string; message: string; severity: string };
export type Report = {
  id: string;
  layer: string;
  crs: { epsg: number | null; name: string; source: string };
  summary: { total: number; ok: number; repaired: number; rejected: number; byCode: Record<string, number> };
  features: {
    index: number;
    reference: string | null;
    status: 'ok' | 'repaired' | 'rejected';
    issues: Issue[];
    areaHa: number | null;
  }[];
  omitted: number;
  timings?: { parseMs: number; validateMs: number };
};
export type Saved = {
  batchId: string;
  purpose: string;
  saved: number;
  rejected: number;
  referenceVersion: { id: number; kind: string; version: number } | null;
  timings?: { storeMs: number; overlayMs: number };
};
export type Mapping = Record<string, string | undefined>;
export type ServerPhase =
  | 'reading'
  | 'staged'
  | 'checking'
  | 'keeping'
  | 'comparing'
  | 'validated'
  | 'storing'
  | 'overlay'
  | 'saved'
  | 'failed'
  | 'cancelled';
/** GET /api/uploads/{id}: where the upload stands, as stored on the server. */
export type UploadStatus = {
  id: string;
  purpose: 'parcels' | 'reference';
  fileName: string;
  state: 'running' | 'staged' | 'validated' | 'saved' | 'failed' | 'cancelled' | 'expired';
  phase: ServerPhase;
  failedIn: ServerPhase | null;
  done: number | null;
  total: number | null;
  startedAt: string;
  phaseStartedAt: string;
  updatedAt: string;
  message: string | null;
  staged: Staged | null;
  choice: { layer: string; epsg: number | null; mapping: Mapping } | null;
  report: Report | null;
  saved: Saved | null;
};
