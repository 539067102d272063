/**
 * Plausibility of a grassland-to-cropland soil-carbon loss against field studies (pure).
 * The band 20-60 % of topsoil carbon spans the usual syntheses; the screen names them.
 */
export const FIELD_STUDY_BAND = { low: 0.2, high: 0.6 } as const;

export const FIELD_STUDIES = [
  'Davidson & Ackerman (1993), Biogeochemistry 20:161-193: cultivation of previously untilled soils loses 20-40 % of soil carbon.',
  'Guo & Gifford (2002), Global Change Biology 8:345-360: pasture to crop, -59 % (meta-analysis of 74 publications).',
  'Poeplau et al. (2011), Global Change Biology 17:2415-2427: grassland to cropland in the temperate zone, about -36 %.',
];

export type Plausibility = {
  applicable: boolean;
  /** Soil-carbon loss as a share of the starting stock (mineral soils, area-weighted). */
  lossShare: number | null;
  band: { low: number; high: number };
  inBand: boolean | null;
  studies: string[];
  message: string;
};

export function checkPlausibility(converts: boolean, socBefore: number, socAfter: number): Plausibility {
  const base = { band: { ...FIELD_STUDY_BAND }, studies: FIELD_STUDIES };
  if (!converts || socBefore <= 0) {
    return {
      ...base,
      applicable: false,
      lossShare: null,
      inBand: null,
      message: 'Not a conversion of grassland to cropland on mineral soil: the field-study band does not apply.',
    };
  }
  const loss = (socBefore - socAfter) / socBefore;
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  const inBand = loss >= FIELD_STUDY_BAND.low && loss <= FIELD_STUDY_BAND.high;
  return {
    ...base,
    applicable: true,
    lossShare: loss,
    inBand,
    message: inBand
      ? `The estimate loses ${pct(loss)} of the starting topsoil carbon, inside ` +
        `the ${pct(FIELD_STUDY_BAND.low)}-${pct(FIELD_STUDY_BAND.high)} reported by field studies.`
      : `Check this: the estimate loses ${pct(loss)} of the starting topsoil carbon, outside ` +
        `the ${pct(FIELD_STUDY_BAND.low)}-${pct(FIELD_STUDY_BAND.high)} reported by field studies. Look at the ` +
        `soil classes, the climate region and the states chosen.`,
  };
}
