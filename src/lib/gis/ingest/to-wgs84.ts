import { bboxLooksLikeDegrees, reproject, type CrsDefinition } from '../crs';
import { GisInputError, isGisInputError } from '../errors';
import { bboxOf, mapPositions } from '../rings';
import type { RawFeature } from '../types';

/** Bounding box over all features' raw coordinates, or null when none have coordinates. */
export function layerBbox(features: RawFeature[]): [number, number, number, number] | null {
  let box: [number, number, number, number] | null = null;
  for (const f of features) {
    const b = f.geometry ? bboxOf(f.geometry) : null;
    if (!b) continue;
    box = box ? [Math.min(box[0], b[0]), Math.min(box[1], b[1]), Math.max(box[2], b[2]), Math.max(box[3], b[3])] : b;
  }
  return box;
}

/**
 * Converts a layer's raw features to EPSG:4326. `crs` comes from the .prj or from the
 * planner's choice; when it is null the coordinates must already be degrees, otherwise the
 * layer is refused with a message asking for a CRS (shpjs would silently treat metres as
 * degrees). A feature that cannot be converted gets NaN coordinates, which validation reports.
 */
export function layerToWgs84(features: RawFeature[], crs: CrsDefinition | null, layerName: string): RawFeature[] {
  if (crs === null) {
    const box = layerBbox(features);
    if (box && !bboxLooksLikeDegrees(box)) {
      const span = `x ${box[0].toFixed(0)} to ${box[2].toFixed(0)}, y ${box[1].toFixed(0)} to ${box[3].toFixed(0)}`;
      throw new GisInputError(
        'coordinates-not-degrees',
        `Layer "${layerName}" has no .prj and its coordinates (${span}) are not longitude/latitude degrees; choose ` +
          `its coordinate reference system by EPSG code.`,
      );
    }
    return features;
  }
  if (crs.epsg === 4326) return features;
  return features.map((f) => {
    if (!f.geometry) return f;
    try {
      return { ...f, geometry: reproject(f.geometry, crs) };
    } catch (error) {
      if (!isGisInputError(error)) throw error;
      return { ...f, geometry: mapPositions(f.geometry, () => [Number.NaN, Number.NaN]) };
    }
  });
}
