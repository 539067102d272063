import type { ClimateRegion } from './types';

/**
 * THE one place that maps each IPCC climate region to the row or regime keys the factor
 * tables use. Every lookup in the engine goes through `regimeFor`.
 *
 * Sources for the groupings (2006 IPCC Guidelines, Vol 4):
 * - Ch 3 Annex 3A.5: the twelve regions. "Cool temperate" there is "cold temperate" in
 *   Ch 2 Table 2.3 and Ch 6 Table 6.4.
 * - Ch 5 Table 5.5 / Ch 6 Table 6.2 regimes: "Temperate/Boreal" (warm and cool temperate,
 *   boreal; dry if MAP/PET < 1, else moist), "Tropical" (MAT > 18 °C below 1000 m; dry if
 *   MAP < 1000 mm, else moist/wet, wet pooled with moist), "Tropical montane" (above 1000 m).
 * - Polar regions have no row in Tables 2.3, 5.5, 5.6, 6.2, 6.3, 6.4: they map to `polar`,
 *   which every set marks "not applicable", so an estimate for a polar region is refused.
 */

/** Table 2.3 rows (SOC_REF). */
export type SocRefRow =
  | 'boreal'
  | 'cold-temperate-dry'
  | 'cold-temperate-moist'
  | 'warm-temperate-dry'
  | 'warm-temperate-moist'
  | 'tropical-dry'
  | 'tropical-moist'
  | 'tropical-wet'
  | 'tropical-montane'
  | 'polar';
/** Regimes of the stock change factor tables (Table 5.5, Table 6.2). */
export type FactorRegime =
  | 'temperate-boreal-dry'
  | 'temperate-boreal-moist'
  | 'tropical-dry'
  | 'tropical-moist-wet'
  | 'tropical-montane'
  | 'polar';
/** Table 6.4 rows (grassland biomass). */
export type GrassBiomassRow =
  | 'boreal'
  | 'cold-temperate-dry'
  | 'cold-temperate-wet'
  | 'warm-temperate-dry'
  | 'warm-temperate-wet'
  | 'tropical-dry'
  | 'tropical-moist-wet'
  | 'tropical-montane'
  | 'polar';
/** Table 5.9 rows for perennial crops (annual crops use one row for all climates). */
export type CropBiomassRow =
  'temperate' | 'tropical-dry' | 'tropical-moist' | 'tropical-wet' | 'boreal' | 'tropical-montane' | 'polar';
/** Tables 5.6 / 6.3 rows (drained organic soils). */
export type OrganicRow = 'boreal-cold-temperate' | 'warm-temperate' | 'tropical' | 'polar';
/**
 * Moisture for N2O (Ch 11): `wet` selects the wet-climate EF1 and allows leaching
 * (Frac_LEACH applies only where leaching occurs); `dry` means no leaching (no irrigation assumed).
 */
export type N2oMoisture = 'wet' | 'dry';

export interface ClimateRegime {
  socRefRow: SocRefRow;
  factorRegime: FactorRegime;
  grassBiomassRow: GrassBiomassRow;
  cropBiomassRow: CropBiomassRow;
  organicRow: OrganicRow;
  n2oMoisture: N2oMoisture;
}

const r = (
  socRefRow: SocRefRow,
  factorRegime: FactorRegime,
  grassBiomassRow: GrassBiomassRow,
  cropBiomassRow: CropBiomassRow,
  organicRow: OrganicRow,
  n2oMoisture: N2oMoisture,
): ClimateRegime => ({ socRefRow, factorRegime, grassBiomassRow, cropBiomassRow, organicRow, n2oMoisture });

// Arguments of r(), in order: Table 2.3 (socRefRow), Tables 5.5/6.2 (factorRegime), Table 6.4 (grassBiomassRow),
// Table 5.9 perennial (cropBiomassRow), Tables 5.6/6.3 (organicRow), N2O (n2oMoisture).
export const CLIMATE_REGIMES: Readonly<Record<ClimateRegion, ClimateRegime>> = {
  // Tropical montane has no moisture criterion in Annex 3A.5; treated as wet for N2O
  // (leaching counted, wet EF1): the larger-emission choice (engine choice, no source).
  'tropical-montane': r(
    'tropical-montane',
    'tropical-montane',
    'tropical-montane',
    'tropical-montane',
    'tropical',
    'wet',
  ),
  'tropical-wet': r('tropical-wet', 'tropical-moist-wet', 'tropical-moist-wet', 'tropical-wet', 'tropical', 'wet'),
  'tropical-moist': r(
    'tropical-moist',
    'tropical-moist-wet',
    'tropical-moist-wet',
    'tropical-moist',
    'tropical',
    'wet',
  ),
  'tropical-dry': r('tropical-dry', 'tropical-dry', 'tropical-dry', 'tropical-dry', 'tropical', 'dry'),
  'warm-temperate-moist': r(
    'warm-temperate-moist',
    'temperate-boreal-moist',
    'warm-temperate-wet',
    'temperate',
    'warm-temperate',
    'wet',
  ),
  'warm-temperate-dry': r(
    'warm-temperate-dry',
    'temperate-boreal-dry',
    'warm-temperate-dry',
    'temperate',
    'warm-temperate',
    'dry',
  ),
  'cool-temperate-moist': r(
    'cold-temperate-moist',
    'temperate-boreal-moist',
    'cold-temperate-wet',
    'temperate',
    'boreal-cold-temperate',
    'wet',
  ),
  'cool-temperate-dry': r(
    'cold-temperate-dry',
    'temperate-boreal-dry',
    'cold-temperate-dry',
    'temperate',
    'boreal-cold-temperate',
    'dry',
  ),
  'boreal-moist': r('boreal', 'temperate-boreal-moist', 'boreal', 'boreal', 'boreal-cold-temperate', 'wet'),
  'boreal-dry': r('boreal', 'temperate-boreal-dry', 'boreal', 'boreal', 'boreal-cold-temperate', 'dry'),
  'polar-moist': r('polar', 'polar', 'polar', 'polar', 'polar', 'wet'),
  'polar-dry': r('polar', 'polar', 'polar', 'polar', 'polar', 'dry'),
};

/** The table keys for one climate region. */
export function regimeFor(region: ClimateRegion): ClimateRegime {
  return CLIMATE_REGIMES[region];
}
