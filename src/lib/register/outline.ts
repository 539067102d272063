/**
 * SVG paths of register parcels, drawn from their geometry (pure): lon/lat projected
 * equirectangularly around the centre latitude (fine at parcel scale), north up, fitted to a box.
 */
type MultiPolygon = { type: 'MultiPolygon'; coordinates: number[][][][] };

export function outlinePaths(
  geoms: MultiPolygon[],
  width: number,
  height: number,
  padding = 12,
): { paths: string[]; scaleM: { px: number; metres: number } | null } {
  const pts = geoms.flatMap((g) => g.coordinates.flat(2));
  if (!pts.length) return { paths: [], scaleM: null };
  const lat0 = (Math.min(...pts.map((p) => p[1]!)) + Math.max(...pts.map((p) => p[1]!))) / 2;
  const k = Math.cos((lat0 * Math.PI) / 180);
  const xy = (p: number[]) => [p[0]! * k, p[1]!] as const;
  const xs = pts.map((p) => xy(p)[0]),
    ys = pts.map((p) => xy(p)[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const s = Math.min((width - 2 * padding) / (maxX - minX || 1e-9), (height - 2 * padding) / (maxY - minY || 1e-9));
  const ox = (width - (maxX - minX) * s) / 2,
    oy = (height - (maxY - minY) * s) / 2;
  const at = (p: number[]) => {
    const [x, y] = xy(p);
    return `${((x - minX) * s + ox).toFixed(1)},${(height - ((y - minY) * s + oy)).toFixed(1)}`;
  };
  const paths = geoms.map((g) =>
    g.coordinates.map((poly) => poly.map((ring) => `M${ring.map(at).join('L')}Z`).join('')).join(''),
  );
  // One degree of latitude is about 111.32 km (common practice); a scale bar of a round length.
  const metresPerPx = 111_320 / s;
  const target = metresPerPx * width * 0.25;
  const metres = [10, 20, 50, 100, 200, 500, 1000, 2000, 5000].find((m) => m >= target) ?? 10_000;
  return { paths, scaleM: { px: metres / metresPerPx, metres } };
}
