// shpjs 6.2 ships no types (@types/shpjs describes v3). Only what lib/gis uses is declared.
declare module 'shpjs' {
  import type { Geometry } from 'geojson';
  /** Parses .shp bytes; without a projection the coordinates are returned as stored. */
  export function parseShp(shp: DataView | ArrayBuffer | Uint8Array, prj?: string | false): (Geometry | null)[];
}
