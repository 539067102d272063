/**
 * .prj files in ESRI WKT without an EPSG code, for national grids whose datum needs a
 * transformation to WGS 84: PROJ identifies the EPSG CRS and PostGIS applies EPSG's datum
 * transformation, so control points land within 1 m of where they belong. An unknown datum is
 * refused with a message that asks for a code.
 *
 * Expected positions: the Dutch one is a published control point; for the others the EPSG
 * transformation parameters (EPSG Geodetic Parameter Dataset, figures from memory) are applied
 * here by proj4js, a second implementation, with the rotation signs converted by hand to the
 * position-vector convention proj4 uses.
 */
import proj4 from 'proj4';
import type { Position } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { crsFromPrj } from '~/lib/gis/crs-catalogue.server';
import { writePolygonShapefile } from '~/lib/gis/export/shapefile-writer';
import { reprojectLayer } from '~/lib/db/transform';
import { FIELDS, layerEntries, zipOf } from '../unit/gis/shapefile-fixtures';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile, withSetting } from '../support/uploads';

let planner: Session;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(() => testDb.destroy());

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';
/** Ground distance between two lon/lat points, m (equirectangular; fine at these distances, common practice). */
const metres = (a: Position, b: Position) =>
  Math.hypot((a[0]! - b[0]!) * 111_320 * Math.cos((a[1]! * Math.PI) / 180), (a[1]! - b[1]!) * 110_540);

const ESRI = {
  rd:
    'PROJCS["RD_New",GEOGCS["GCS_Amersfoort",DATUM["D_Amersfoort",SPHEROID["Bessel_1841",6377397.155,' +
    '299.1528128]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Double_Stereographic"],' +
    'PARAMETER["False_Easting",155000.0],PARAMETER["False_Northing",463000.0],PARAMETER["Central_Meridian",' +
    '5.38763888888889],PARAMETER["Scale_Factor",0.9999079],PARAMETER["Latitude_Of_Origin",52.15616055555555],UNIT["Meter",1.0]]',
  be:
    'PROJCS["Belge_Lambert_1972",GEOGCS["GCS_Belge_1972",DATUM["D_Belge_1972",SPHEROID["International_1924",' +
    '6378388.0,297.0]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],' +
    'PROJECTION["Lambert_Conformal_Conic"],PARAMETER["False_Easting",150000.013],PARAMETER["False_Northing",' +
    '5400088.438],PARAMETER["Central_Meridian",4.367486666666666],PARAMETER["Standard_Parallel_1",49.8333339],' +
    'PARAMETER["Standard_Parallel_2",51.16666723333333],PARAMETER["Latitude_Of_Origin",90.0],UNIT["Meter",1.0]]',
  de:
    'PROJCS["DHDN_3_Degree_Gauss_Zone_3",GEOGCS["GCS_Deutsches_Hauptdreiecksnetz",' +
    'DATUM["D_Deutsches_Hauptdreiecksnetz",SPHEROID["Bessel_1841",6377397.155,299.1528128]],PRIMEM["Greenwich",' +
    '0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Gauss_Kruger"],PARAMETER["False_Easting",3500000.0],' +
    'PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",9.0],PARAMETER["Scale_Factor",1.0],' +
    'PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]',
  ie:
    'PROJCS["TM75_Irish_Grid",GEOGCS["GCS_TM75",DATUM["D_TM75",SPHEROID["Airy_Modified",6377340.189,' +
    '299.3249646]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],' +
    'PARAMETER["False_Easting",200000.0],PARAMETER["False_Northing",250000.0],PARAMETER["Central_Meridian",-8.0],' +
    'PARAMETER["Scale_Factor",1.000035],PARAMETER["Latitude_Of_Origin",53.5],UNIT["Meter",1.0]]',
};

const viaHelmert = (def: string, p: Position) => proj4(def, WGS84).forward([p[0]!, p[1]!]);

const GRIDS = [
  {
    label: 'RD New (Netherlands)',
    prj: ESRI.rd,
    epsg: 28992,
    point: [155000, 463000],
    // RDNAPTRANS 2018 documentation (Kadaster / Rijkswaterstaat): the Amersfoort origin of RD,
    // x 155 000 m, y 463 000 m, is at φ 52.15517440°, λ 5.38720621° in ETRS89 (from memory).
    expected: [5.38720621, 52.1551744],
  },
  {
    label: 'Belgian Lambert 72',
    prj: ESRI.be,
    epsg: 31370,
    point: [150000, 170000],
    // EPSG transformation 15929 "BD72 to WGS 84 (3)", coordinate frame: tx -106.8686, ty 52.2978, tz -103.7239 m,
    // rx -0.3366, ry 0.457, rz -1.8422", ds -1.2747 ppm (from memory); rotations negated for proj4.
    expected: viaHelmert(
      '+proj=lcc +lat_0=90 +lon_0=4.36748666666667 +lat_1=51.1666672333333 +lat_2=49.8333339 +x_0=150000.013 ' +
        '+y_0=5400088.438 +ellps=intl +towgs84=-106.8686,52.2978,-103.7239,0.3366,-0.457,1.8422,-1.2747 +units=m',
      [150000, 170000],
    ),
  },
  {
    label: 'DHDN / Gauss-Krüger zone 3 (Germany)',
    prj: ESRI.de,
    epsg: 31467,
    point: [3500000, 5500000],
    // EPSG transformation 1777 "DHDN to WGS 84 (2)", position vector: 598.1, 73.7, 418.2 m, 0.202, 0.045, -2.455", 6.7 ppm
    // (from memory; stated accuracy 3 m, PROJ may use the finer BETA2007 grid instead).
    expected: viaHelmert(
      '+proj=tmerc +lat_0=0 +lon_0=9 +k=1 +x_0=3500000 +y_0=0 +ellps=bessel +towgs84=598.1,73.7,418.2,0.202,0.045,-2.455,6.7 +units=m',
      [3500000, 5500000],
    ),
  },
  {
    label: 'TM75 / Irish Grid',
    prj: ESRI.ie,
    epsg: 29903,
    point: [200000, 250000],
    // EPSG transformation 1954 "TM75 to WGS 84 (2)", position vector: 482.5, -130.6, 564.6 m, -1.042, -0.214, -0.631", 8.15 ppm (from memory).
    expected: viaHelmert(
      '+proj=tmerc +lat_0=53.5 +lon_0=-8 +k=1.000035 +x_0=200000 +y_0=250000 +a=6377340.189 +rf=299.3249646 ' +
        '+towgs84=482.5,-130.6,564.6,-1.042,-0.214,-0.631,8.15 +units=m',
      [200000, 250000],
    ),
  },
];

describe('national grids as ESRI WKT without an EPSG code', () => {
  for (const g of GRIDS) {
    it(`${g.label}: identified as EPSG:${g.epsg}, control point within 1 m`, async () => {
      const crs = await crsFromPrj(g.prj);
      expect(crs.epsg).toBe(g.epsg);
      const square = {
        type: 'Polygon' as const,
        coordinates: [[g.point, [g.point[0]! + 100, g.point[1]!], [g.point[0]! + 100, g.point[1]! + 100], g.point]],
      };
      const [f] = await reprojectLayer(testDb, [{ geometry: square, properties: {} }], crs, 'control');
      const got = (f!.geometry as { coordinates: Position[][] }).coordinates[0]![0]!;
      expect(metres(got, g.expected)).toBeLessThan(1);
    });
  }

  it('a whole upload: an RD New shapefile whose .prj has no EPSG code lands in the right place', async () => {
    const x = 155000;
    const y = 463000;
    const files = writePolygonShapefile(
      [
        {
          geometry: {
            type: 'Polygon',
            coordinates: [
              [
                [x, y],
                [x + 100, y],
                [x + 100, y + 100],
                [x, y + 100],
                [x, y],
              ],
            ],
          },
          properties: { field_ref: 'RD-1', name: 'Amersfoort', stated_ha: null, last_till: null },
        },
      ],
      { fields: FIELDS, prjWkt: ESRI.rd },
    );
    const staged = await uploadFile(planner, 'rd-new.zip', zipOf(layerEntries('rd', files)));
    expect(staged.body.layers[0].crs).toMatchObject({ epsg: 28992, source: 'prj' });
    await withSetting('territory', null, async () => {
      const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
        session: planner,
        body: { layer: 'rd', mapping: { reference: 'field_ref' } },
      });
      expect(report.body.summary).toMatchObject({ total: 1, rejected: 0 });
    });
    const row = await testDb.raw(
      'select st_x(st_startpoint(st_exteriorring(st_geometryn(geom, 1)))) x, ' +
        'st_y(st_startpoint(st_exteriorring(st_geometryn(geom, 1)))) y from upload_staging_feature where staging_id = ?',
      [staged.body.id],
    );
    expect(metres([row.rows[0].x, row.rows[0].y], GRIDS[0]!.expected)).toBeLessThan(1);
    await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  });

  it('refuses a .prj on a datum with no known transformation to WGS 84, and asks for a code', async () => {
    const invented = ESRI.ie
      .replace('TM75_Irish_Grid', 'Tarrow_Estate_Grid')
      .replace('GCS_TM75', 'GCS_Tarrow_1911')
      .replace('D_TM75', 'D_Tarrow_1911')
      .replace('"Airy_Modified",6377340.189,299.3249646', '"Clarke_1880",6378249.145,293.465')
      .replace('-8.0', '-7.25');
    await expect(crsFromPrj(invented)).rejects.toThrow(
      'The .prj "Tarrow_Estate_Grid" is on a datum for which no transformation to WGS 84 is known, so its ' +
        'coordinates cannot be placed to the metre. Choose the coordinate reference system by EPSG code (one with ' +
        'a known transformation), or add TOWGS84 parameters to the .prj.',
    );
    const files = writePolygonShapefile(
      [
        {
          geometry: {
            type: 'Polygon',
            coordinates: [
              [
                [200000, 250000],
                [200100, 250000],
                [200100, 250100],
                [200000, 250000],
              ],
            ],
          },
          properties: { field_ref: 'TE-1', name: 'x', stated_ha: null, last_till: null },
        },
      ],
      { fields: FIELDS, prjWkt: invented },
    );
    const staged = await uploadFile(planner, 'estate.zip', zipOf(layerEntries('estate', files)));
    expect(staged.body.layers[0].crs).toBeNull();
    expect(staged.body.layers[0].crsNote).toMatch(
      /no transformation to WGS 84 is known.*Choose the coordinate reference system by EPSG code/,
    );
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: 'estate', mapping: { reference: 'field_ref' } },
    });
    expect(report.status).toBe(422);
    expect(report.body.error.message).toMatch(/no transformation to WGS 84 is known/);
    await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  });
});
