import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import {
  epsgCodeFromWkt,
  firstOutsideAreaOfUse,
  fromWgs84,
  reproject,
  toWgs84,
  type CrsDefinition,
} from '~/lib/gis/crs';
import { crsFromEpsg, crsFromPrj, normaliseCrsName, searchCrs } from '~/lib/gis/crs-catalogue.server';

const dms = (d: number, m: number, s: number) => d + m / 60 + s / 3600;

/** BNG projection on the Airy 1830 ellipsoid with no datum shift: the projection maths alone. */
const BNG_NO_SHIFT: CrsDefinition = {
  epsg: null,
  name: 'BNG (projection only)',
  definition: '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m +no_defs',
  areaOfUse: null,
  isGeographic: false,
};

const ESRI_BNG_PRJ =
  'PROJCS["British_National_Grid",GEOGCS["GCS_OSGB_1936",DATUM["D_OSGB_1936",SPHEROID["Airy_1830",6377563.396,' +
  '299.3249646]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],' +
  'PARAMETER["False_Easting",400000.0],PARAMETER["False_Northing",-100000.0],PARAMETER["Central_Meridian",' +
  '-2.0],PARAMETER["Scale_Factor",0.9996012717],PARAMETER["Latitude_Of_Origin",49.0],UNIT["Meter",1.0]]';
const ESRI_UTM28_PRJ =
  'PROJCS["WGS_1984_UTM_Zone_28N",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,' +
  '298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],' +
  'PARAMETER["False_Easting",500000.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-15.0],' +
  'PARAMETER["Scale_Factor",0.9996],PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]';

describe('reprojection against published control points', () => {
  // EPSG Guidance Note 7-2 (IOGP Publication 373-7-2), Transverse Mercator worked example for
  // OSGB 1936 / British National Grid: E 651 409.903 m, N 313 177.270 m ↔
  // φ 52°39'27.2531"N, λ 1°43'04.5177"E on OSGB 1936 (figures from memory).
  const lat = dms(52, 39, 27.2531);
  const lon = dms(1, 43, 4.5177);

  it('inverse: grid coordinates to latitude/longitude within 0.0001"', () => {
    const [x, y] = toWgs84([651409.903, 313177.27], BNG_NO_SHIFT);
    expect(Math.abs(x! - lon) * 3600).toBeLessThan(1e-4);
    expect(Math.abs(y! - lat) * 3600).toBeLessThan(1e-4);
  });

  it('forward: latitude/longitude to grid coordinates within 1 mm', () => {
    const [e, n] = fromWgs84([lon, lat], BNG_NO_SHIFT);
    expect(Math.abs(e! - 651409.903)).toBeLessThan(0.001);
    expect(Math.abs(n! - 313177.27)).toBeLessThan(0.001);
  });

  it('UTM by definition: the central meridian maps to E 500 000 m and the equator to N 0 (common practice)', async () => {
    const utm28 = await crsFromEpsg(32628);
    const [e, n] = fromWgs84([-15, 0], utm28);
    expect(e).toBeCloseTo(500000, 6);
    expect(n).toBeCloseTo(0, 6);
  });
});

describe('reprojection against proj4 itself', () => {
  it('national grid: an ESRI BNG .prj agrees with proj4 using the OSGB36→WGS 84 Helmert parameters within 1 cm', async () => {
    // 7-parameter shift from Ordnance Survey, "A guide to coordinate systems in Great Britain" (from memory).
    const direct = proj4(
      '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m',
      '+proj=longlat +datum=WGS84',
    );
    const crs = await crsFromPrj(ESRI_BNG_PRJ);
    expect(crs.epsg).toBe(27700);
    for (const p of [
      [651409.903, 313177.27],
      [325000, 673000],
      [530000, 180000],
    ]) {
      const ours = toWgs84(p, crs);
      const theirs = direct.forward(p);
      expect(Math.abs(ours[0]! - theirs[0]!) * 111_320 * Math.cos((ours[1]! * Math.PI) / 180)).toBeLessThan(0.01);
      expect(Math.abs(ours[1]! - theirs[1]!) * 110_540).toBeLessThan(0.01);
    }
  });

  it('UTM zone: a polygon reprojected from EPSG:32628 matches proj4 vertex by vertex', async () => {
    const crs = await crsFromEpsg(32628);
    const direct = proj4('+proj=utm +zone=28 +datum=WGS84 +units=m', 'EPSG:4326');
    const ring = [
      [430000, 5805000],
      [430500, 5805000],
      [430500, 5805400],
      [430000, 5805000],
    ];
    const out = reproject({ type: 'Polygon', coordinates: [ring] }, crs);
    out.coordinates[0]!.forEach((p, i) => {
      const q = direct.forward(ring[i]!);
      expect(p[0]).toBeCloseTo(q[0]!, 10);
      expect(p[1]).toBeCloseTo(q[1]!, 10);
    });
  });
});

describe('crsFromPrj and the EPSG catalogue', () => {
  it('reads the top-level EPSG authority and ignores nested ones', () => {
    expect(epsgCodeFromWkt('PROJCS["x",GEOGCS["y",AUTHORITY["EPSG","4326"]],AUTHORITY["EPSG","32628"]]')).toBe(32628);
    expect(epsgCodeFromWkt('PROJCS["x",GEOGCS["y",AUTHORITY["EPSG","4326"]]]')).toBeNull();
    expect(epsgCodeFromWkt('PROJCRS["x",BASEGEOGCRS["y",ID["EPSG",4326]],ID["EPSG",25832]]')).toBe(25832);
  });

  it('matches ESRI spellings to EPSG names', () => {
    expect(normaliseCrsName('WGS_1984_UTM_Zone_28N')).toBe(normaliseCrsName('WGS 84 / UTM zone 28N'));
    expect(normaliseCrsName('ETRS_1989_UTM_Zone_32N')).toBe(normaliseCrsName('ETRS89 / UTM zone 32N'));
  });

  it('recognises an ESRI UTM .prj without authority as EPSG:32628', async () => {
    const crs = await crsFromPrj(ESRI_UTM28_PRJ);
    expect(crs.epsg).toBe(32628);
    expect(crs.areaOfUse).toEqual([-18, 0, -12, 84]);
  });

  it('falls back to the WKT itself for a custom CRS', async () => {
    const custom = ESRI_UTM28_PRJ.replace('WGS_1984_UTM_Zone_28N', 'Estate_Grid').replace('-15.0', '-15.5');
    const crs = await crsFromPrj(custom);
    expect(crs.epsg).toBeNull();
    expect(crs.name).toBe('Estate_Grid');
    expect(toWgs84([500000, 0], crs)[0]).toBeCloseTo(-15.5, 9);
  });

  it('rejects an unreadable .prj with a clear message', async () => {
    await expect(crsFromPrj('this is not WKT')).rejects.toThrow(
      /coordinate reference system "unnamed CRS from \.prj" cannot be read/,
    );
  });

  it('rejects unknown EPSG codes and non-2D kinds', async () => {
    await expect(crsFromEpsg(999999)).rejects.toThrow(
      'EPSG:999999 is not a projected or geographic CRS known to this app.',
    );
    await expect(crsFromEpsg(5701)).rejects.toThrow(/EPSG:5701 is not/); // a vertical CRS
  });

  it('uses the WKT when the proj4 string needs a grid file proj4 does not ship (EPSG:27700)', async () => {
    const bng = await crsFromEpsg(27700);
    expect(bng.definition).not.toContain('nadgrids');
    expect(Number.isFinite(toWgs84([651409.903, 313177.27], bng)[0])).toBe(true);
  });

  it('searches by code, by name and by UTM zone, common grids first', async () => {
    expect((await searchCrs('27700', 5))[0]).toMatchObject({ epsg: 27700, name: 'OSGB36 / British National Grid' });
    expect((await searchCrs('EPSG:32628', 5))[0]!.epsg).toBe(32628);
    expect((await searchCrs('british national grid', 5))[0]!.epsg).toBe(27700);
    const utm = (await searchCrs('utm 33n', 3)).map((h) => h.epsg);
    expect(utm).toEqual(expect.arrayContaining([25833, 32633]));
    expect(await searchCrs('utm', 7)).toHaveLength(7);
    expect(await searchCrs('   ', 5)).toEqual([]);
  });

  it('flags positions outside a CRS area of use', async () => {
    const utm28 = await crsFromEpsg(32628);
    const inside = { type: 'Point' as const, coordinates: [-16, 52] };
    const outside = { type: 'Point' as const, coordinates: [10, 52] };
    expect(firstOutsideAreaOfUse(inside, utm28)).toBeNull();
    expect(firstOutsideAreaOfUse(outside, utm28)).toEqual([10, 52]);
  });
});
