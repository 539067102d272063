/**
 * Staged features as the JSON text the staging insert takes (one jsonb parameter per chunk).
 * Built in the worker pool, so the request thread only hands strings to PostgreSQL and never
 * walks a huge geometry itself (pure).
 */
import type { StagedFeature } from './stage-features';

export const STAGE_CHUNK = 2000;

export function stagedFeatureChunks(features: StagedFeature[], size = STAGE_CHUNK): string[] {
  const out: string[] = [];
  for (let at = 0; at < features.length; at += size) {
    const chunk = features.slice(at, at + size).map((f) => ({
      ...f,
      geom: f.geom ? JSON.stringify(f.geom) : null,
      rawGeom: f.rawGeom ? JSON.stringify(f.rawGeom) : null,
    }));
    out.push(JSON.stringify(chunk));
  }
  return out;
}
