import { describe, expect, it } from 'vitest';
import { deriveLandUseFlags, yearsBefore, type LandUseEvent } from '~/lib/gis/land-use-history';

const asOf = '2025-06-30';

describe('deriveLandUseFlags', () => {
  it('grassland since 2012 after arable: permanent (≥ 5 years, EU 2021/2115 Art. 4(3)(c)) but cultivated in the 15-year window', () => {
    const events: LandUseEvent[] = [
      { date: '2008-04-01', kind: 'land-use', value: 'arable' },
      { date: '2011-09-15', kind: 'tillage', value: 'ploughed' },
      { date: '2012-04-01', kind: 'land-use', value: 'grassland' },
    ];
    const flags = deriveLandUseFlags(events, { asOf });
    expect(flags.currentLandUse).toBe('grassland');
    expect(flags.permanentGrassland).toEqual({
      value: true,
      reason:
        'Grassland since 1 Apr 2012 (after "arable" in 1 Apr 2008): out of the crop rotation for 5 years or more on 30 Jun 2025.',
    });
    expect(flags.uncultivated).toEqual({
      value: false,
      reason: 'Cultivated on 15 Sept 2011 (tillage: ploughed), within the last 15 years.',
    });
    expect(flags.neverTilled.value).toBe(false);
  });

  it('grassland only since 2022 after arable is not yet permanent', () => {
    const flags = deriveLandUseFlags(
      [
        { date: '2019-01-01', kind: 'land-use', value: 'arable' },
        { date: '2022-03-01', kind: 'land-use', value: 'temporary-grassland' },
      ],
      { asOf },
    );
    expect(flags.permanentGrassland.value).toBe(false);
    expect(flags.permanentGrassland.reason).toMatch(
      /^Grassland only since 1 Mar 2022 .*less than 5 years before 30 Jun 2025\.$/,
    );
  });

  it('the windows are settings: 3 years makes the same parcel permanent', () => {
    const events: LandUseEvent[] = [
      { date: '2019-01-01', kind: 'land-use', value: 'arable' },
      { date: '2022-03-01', kind: 'land-use', value: 'grassland' },
    ];
    expect(deriveLandUseFlags(events, { asOf, permanentGrasslandYears: 3 }).permanentGrassland.value).toBe(true);
  });

  it('Member-State option: a reseed restarts the permanent-grassland count', () => {
    const events: LandUseEvent[] = [
      { date: '2000-05-01', kind: 'land-use', value: 'grassland' },
      { date: '2023-08-20', kind: 'reseeding', value: 'direct drilled' },
    ];
    expect(deriveLandUseFlags(events, { asOf }).permanentGrassland.value).toBe(true);
    const strict = deriveLandUseFlags(events, { asOf, tillageEndsGrassland: true }).permanentGrassland;
    expect(strict).toEqual({
      value: false,
      reason:
        'Grassland only since 20 Aug 2023 (since the reseeding of 20 Aug 2023): less than 5 years before 30 Jun 2025.',
    });
  });

  it('old grassland with no cultivation for 15 years: uncultivated and never tilled', () => {
    const events: LandUseEvent[] = [
      { date: '1990-01-01', kind: 'land-use', value: 'grassland' },
      { date: '2015-05-05', kind: 'management', value: 'grazed' },
    ];
    const flags = deriveLandUseFlags(events, { asOf });
    expect(flags.uncultivated).toEqual({
      value: true,
      reason: 'No cultivation recorded between 30 Jun 2010 and 30 Jun 2025.',
    });
    expect(flags.neverTilled).toEqual({
      value: true,
      reason: 'No tillage or arable use recorded since records began on 1 Jan 1990.',
    });
    expect(flags.permanentGrassland.reason).toMatch(
      /^Grassland at least since 1 Jan 1990 \(with no other use recorded\)/,
    );
  });

  it('liming counts as cultivation when flagged (chemical cultivation, England EIA guidance, from memory)', () => {
    const events: LandUseEvent[] = [
      { date: '1990-01-01', kind: 'land-use', value: 'grassland' },
      { date: '2018-02-01', kind: 'management', value: 'lime applied', cultivation: true },
    ];
    expect(deriveLandUseFlags(events, { asOf }).uncultivated.value).toBe(false);
    expect(deriveLandUseFlags(events, { asOf, uncultivatedYears: 5 }).uncultivated.value).toBe(true);
  });

  it('returns null (undecided) when the history is too short, and ignores events after asOf', () => {
    const events: LandUseEvent[] = [
      { date: '2021-01-01', kind: 'land-use', value: 'grassland' },
      { date: '2026-01-01', kind: 'tillage' },
    ];
    const flags = deriveLandUseFlags(events, { asOf });
    expect(flags.permanentGrassland.value).toBeNull();
    expect(flags.uncultivated).toEqual({
      value: null,
      reason: 'Records begin 1 Jan 2021, later than 30 Jun 2010: the 15-year window is not covered.',
    });
    expect(flags.neverTilled.value).toBe(true);
    expect(deriveLandUseFlags([], { asOf }).permanentGrassland.reason).toBe(
      'No land use is recorded, so permanent grassland cannot be decided.',
    );
  });

  it('rejects malformed dates with a clear message', () => {
    expect(() => deriveLandUseFlags([{ date: '2021-02-30', kind: 'tillage' }], { asOf })).toThrow(
      'Event 1 date "2021-02-30" is not a calendar date in the form YYYY-MM-DD.',
    );
    expect(() => deriveLandUseFlags([], { asOf: '30/06/2025' })).toThrow(/asOf "30\/06\/2025"/);
  });

  it('yearsBefore keeps the calendar day and maps 29 February to 28 February', () => {
    expect(yearsBefore('2025-06-30', 15)).toBe('2010-06-30');
    expect(yearsBefore('2024-02-29', 5)).toBe('2019-02-28');
  });
});
