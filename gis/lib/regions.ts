import type { Box } from './layers';

/**
 * The two invented demo regions. Both sit over open ocean (invented islands), so the synthetic
 * fields cannot be mistaken for real land. Boxes are [x0, y0, x1, y1] in metres from the
 * region's grid origin, in the region's UTM zone. Boundaries deliberately cut across parcels
 * so some parcels straddle two soil or slope units.
 */
export interface RegionSpec {
  key: string;
  /** Invented island name. */
  label: string;
  epsg: number;
  /** Grid origin, lon/lat degrees (south-west corner of the field pattern). */
  originLonLat: [number, number];
  cols: number;
  rows: number;
  cellWidthM: number;
  cellHeightM: number;
  jitterM: number;
  layers: {
    climate: [string, Box[]][];
    soil: [string, Box[]][];
    slope: [string, Box[]][];
    sensitive: { name: string; code: string; box: Box }[];
    neverTilled: Box[];
    /** Accounting regions (districts): key, invented name, boxes. */
    districts: { key: string; name: string; boxes: Box[] }[];
  };
}

export const CORROWMERE: RegionSpec = {
  key: 'corrowmere',
  label: 'Corrowmere (invented island, cool temperate moist)',
  epsg: 32628,
  originLonLat: [-16.02, 52.38],
  cols: 20,
  rows: 15,
  cellWidthM: 260,
  cellHeightM: 210,
  jitterM: 30,
  layers: {
    climate: [['cool-temperate-moist', [[-1000, -1000, 6200, 4150]]]],
    soil: [
      [
        'hac',
        [
          [-1000, -1000, 1830, 1600],
          [1830, 1000, 3390, 4150],
          [4500, -1000, 6200, 2730],
          [4500, 2730, 4940, 4150],
        ],
      ],
      ['spodic', [[-1000, 1600, 1830, 4150]]],
      ['sandy', [[1830, -1000, 3390, 1000]]],
      ['wetland', [[3390, -1000, 4500, 2000]]],
      ['organic', [[3390, 2000, 4500, 4150]]],
    ],
    slope: [
      ['flat', [[-1000, -1000, 6200, 1200]]],
      [
        'moderate',
        [
          [-1000, 1200, 6200, 2400],
          [2600, 2400, 6200, 4150],
        ],
      ],
      ['steep', [[-1000, 2400, 2600, 4150]]],
    ],
    sensitive: [
      { name: 'Skarrowen Head grassland', code: 'SG-01', box: [300, 2300, 1300, 3400] },
      { name: 'Fenbrook meadows', code: 'SG-02', box: [3500, 200, 4300, 900] },
    ],
    neverTilled: [[200, 2200, 1500, 3300]],
    districts: [
      { key: 'skarrow', name: 'Skarrow district', boxes: [[-1000, -1000, 2600, 4150]] },
      { key: 'fenbrook', name: 'Fenbrook district', boxes: [[2600, -1000, 6200, 4150]] },
    ],
  },
};

export const VELOMARI: RegionSpec = {
  key: 'velomari',
  label: 'Velomari (invented island, tropical moist)',
  epsg: 32747,
  originLonLat: [96.3, -7.8],
  cols: 8,
  rows: 5,
  cellWidthM: 180,
  cellHeightM: 150,
  jitterM: 20,
  layers: {
    climate: [
      ['tropical-moist', [[-500, -500, 1000, 1250]]],
      ['tropical-wet', [[1000, -500, 1940, 1250]]],
    ],
    soil: [
      ['lac', [[-500, 200, 700, 1250]]],
      ['volcanic', [[700, 200, 1940, 1250]]],
      ['wetland', [[-500, -500, 1940, 200]]],
    ],
    slope: [
      ['flat', [[-500, -500, 1940, 350]]],
      ['moderate', [[-500, 350, 900, 1250]]],
      ['steep', [[900, 350, 1940, 1250]]],
    ],
    sensitive: [{ name: 'Tembiri grassland', code: 'SG-11', box: [100, 400, 500, 800] }],
    neverTilled: [[1000, 450, 1400, 800]],
    districts: [{ key: 'tembiri', name: 'Tembiri district', boxes: [[-500, -500, 1940, 1250]] }],
  },
};
