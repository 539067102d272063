/** A GeoJSON file of `count` small square parcels on a grid, for uploads big enough to watch their progress. */
import { rect } from './proposals';

/** Squares of `sizeM` metres every `pitchM` metres, `cols` to a row, from [x0, y0] of the demo grid (metres). */
export function gridGeoJson(
  prefix: string,
  count: number,
  [x0, y0]: [number, number],
  { cols = 80, sizeM = 40, pitchM = 60 } = {},
): string {
  const features = Array.from({ length: count }, (_, i) => {
    const [x, y] = [x0 + (i % cols) * pitchM, y0 + Math.floor(i / cols) * pitchM];
    return {
      type: 'Feature',
      properties: { ref: `${prefix}-${String(i + 1).padStart(5, '0')}` },
      geometry: rect([x, y, x + sizeM, y + sizeM]),
    };
  });
  return JSON.stringify({ type: 'FeatureCollection', features });
}
