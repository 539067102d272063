/**
 * Parcel references (what may be one, when two are the same) and the overlap rules (pure).
 * Unicode facts are from the Unicode Standard: UAX #15 (NFKC maps full-width forms to ASCII),
 * UTS #39 (confusables.txt: Cyrillic capital TE U+0422 is confusable with Latin T), and the
 * General Category Cf of U+200B ZERO WIDTH SPACE and U+202E RIGHT-TO-LEFT OVERRIDE.
 */
import { describe, expect, it } from 'vitest';
import { mapParcelFeature, parcelMappingSchema, readChoice } from '~/lib/gis/field-mapping';
import { classifyOverlap, overlapIssue } from '~/lib/gis/overlap';
import { referenceKey, referenceProblem } from '~/lib/gis/references';

describe('parcel references', () => {
  it('gives references that differ by case, width or look-alike letters the same key', () => {
    const key = referenceKey('TAR-0012');
    expect(referenceKey('tar-0012')).toBe(key); // case
    expect(referenceKey('ＴＡＲ－００１２')).toBe(key); // full-width forms (UAX #15, NFKC)
    expect(referenceKey('\u0422\u0410\u0420-0012')).toBe(referenceKey('TAP-0012')); // Cyrillic ТАР looks like Latin TAP (UTS #39)
    expect(referenceKey('Straße 4')).toBe(referenceKey('STRASSE 4')); // full case mapping of ß (Unicode SpecialCasing.txt)
    expect(referenceKey('TIR-1')).not.toBe(referenceKey('TLR-1')); // I and L stay apart
    expect(referenceKey('TAR-0013')).not.toBe(key);
  });

  it('refuses invisible, text-direction and mixed-script references', () => {
    expect(referenceProblem('TAR\u200B-0012')).toMatch(/invisible or text-direction control character \(U\+200B\)/);
    expect(referenceProblem('TAR-\u202E2100')).toMatch(/U\+202E/);
    expect(referenceProblem('TAR-\u00AD12')).toMatch(/U\+00AD/); // soft hyphen, category Cf
    expect(referenceProblem('\u0422AR-0012')).toBe(
      'Parcel reference "\u0422AR-0012" mixes Latin and Cyrillic letters, which look alike; use letters of one alphabet.',
    );
    expect(referenceProblem('TAR-0012')).toBeNull();
    expect(referenceProblem('\u0422\u0410\u0420-12')).toBeNull(); // one script (Cyrillic) is allowed
  });
});

describe('land-use values and dates at the mapping step', () => {
  const m = parcelMappingSchema.parse({
    reference: 'ref',
    landUse: 'use',
    management: 'man',
    grassSince: 'grass',
    lastTillageDate: '2010-04-01',
  });
  const today = '2026-12-02';

  it('accepts the values of the events route, or their labels, and refuses anything else', () => {
    expect(readChoice('Temporary grassland (ley)', 'land-use')).toEqual({ value: 'temporary-grassland', bad: false });
    expect(readChoice('PASTURE', 'land-use')).toEqual({ value: 'pasture', bad: false });
    expect(readChoice('grass-ish', 'land-use').bad).toBe(true);
    const r = mapParcelFeature({ ref: 'P-1', use: 'permanent pasture', man: 'burnt' }, m, today);
    expect(r.issues.map((i) => i.code)).toEqual(['bad-land-use', 'bad-management']);
    expect(r.issues[0]!.message).toMatch(
      /^Land use "permanent pasture" \(column "use"\) is not on the list; use one of: grassland, /,
    );
  });

  it('reads "in grass since" per parcel and one tillage date for the file; refuses future dates and contradictions', () => {
    const r = mapParcelFeature({ ref: 'P-1', use: 'pasture', grass: '2012-05-01' }, m, today);
    expect(r.fields).toMatchObject({ landUse: 'pasture', grassSince: '2012-05-01', lastTillage: '2010-04-01' });
    expect(r.issues).toEqual([]);
    expect(mapParcelFeature({ ref: 'P-2', grass: '2031-01-01' }, m, today).issues[0]!.message).toBe(
      'In grass since 2031-01-01 (column "grass") lies in the future (today is 2026-12-02).',
    );
    expect(
      mapParcelFeature({ ref: 'P-3', use: 'arable', grass: '2012-05-01' }, m, today).issues.map((i) => i.code),
    ).toEqual(['history-contradiction']);
    const fileDate = parcelMappingSchema.parse({ reference: 'ref', grassSinceDate: '2015-03-01' });
    expect(mapParcelFeature({ ref: 'P-4' }, fileDate, today).fields.grassSince).toBe('2015-03-01');
  });
});

describe('overlap rules', () => {
  const t = { maxShare: 0.02, maxM2: 100, nearDuplicateShare: 0.05 };
  // Two 1 ha squares (100 m × 100 m); arithmetic from the definitions in overlap.ts.
  it('a 48 % overlap is an error naming both parcels and the area', () => {
    const issue = overlapIssue(
      { areaAM2: 10_000, areaBM2: 10_000, overlapM2: 4_800 },
      t,
      'Feature 2 (B)',
      'feature 1 (A)',
    );
    expect(issue).toEqual({
      code: 'overlap',
      severity: 'error',
      message:
        'Feature 2 (B) overlaps feature 1 (A) by 4800.0 m² (48.0 % of the smaller parcel), more than the tolerance of 2.0 % and 100.0 m².',
    });
  });

  it('a 15 m shift overlaps by 85 % and is an error; a 0.5 m shift is a near-duplicate', () => {
    expect(classifyOverlap({ areaAM2: 10_000, areaBM2: 10_000, overlapM2: 8_500 }, t)!.kind).toBe('overlap');
    const nudged = classifyOverlap({ areaAM2: 10_000, areaBM2: 10_000, overlapM2: 9_950 }, t)!;
    expect(nudged).toMatchObject({ kind: 'near-duplicate', differenceM2: 100 });
  });

  it('a sliver along a shared edge is a warning; touching edges are nothing', () => {
    // 100 m edge digitised 0.5 m apart: 50 m², 0.5 % of the smaller parcel.
    expect(
      overlapIssue({ areaAM2: 10_000, areaBM2: 20_000, overlapM2: 50 }, t, 'Feature 2', 'feature 1')!.severity,
    ).toBe('warning');
    // Large parcels: 600 m² along a 400 m edge is 0.4 % of 15 ha, still below the share.
    expect(classifyOverlap({ areaAM2: 150_000, areaBM2: 160_000, overlapM2: 600 }, t)!.kind).toBe('overlap-minor');
    expect(classifyOverlap({ areaAM2: 10_000, areaBM2: 10_000, overlapM2: 0.2 }, t)).toBeNull();
  });
});
