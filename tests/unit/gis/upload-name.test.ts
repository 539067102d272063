import { describe, expect, it } from 'vitest';
import { uploadLabel, uploadName } from '~/lib/gis/upload-name';

// Readable names from file names: extension dropped, separators as spaces (common practice).
describe('upload names', () => {
  it('reads a file name as words', () => {
    expect(uploadName('corrowmere-parcels-utm28n.zip')).toBe('Corrowmere parcels utm28n');
    expect(uploadName('velomari_parcels.geojson')).toBe('Velomari parcels');
    expect(uploadName('C:\\exports\\north.block.shp.zip')).toBe('North block');
    expect(uploadName('.zip')).toBe('.zip');
  });
  it('adds the day it was saved', () => {
    expect(uploadLabel('corrowmere-parcels-noprj.zip', '2026-12-02T21:25:00Z')).toBe(
      'Corrowmere parcels noprj, uploaded 2 Dec 2026',
    );
    expect(uploadLabel('a.zip', null)).toBe('A');
  });
});
