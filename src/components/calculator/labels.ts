/** Plain-words names of the IPCC classes used on screens (the keys stay the API's). */
import type {
  ClimateRegion,
  CroplandInput,
  CroplandSystem,
  GrasslandInput,
  GrasslandManagement,
  GwpSet,
  SoilType,
  Tillage,
} from '~/lib/carbon';

export const CLIMATE_LABELS: Record<ClimateRegion, string> = {
  'tropical-montane': 'Tropical montane',
  'tropical-wet': 'Tropical wet',
  'tropical-moist': 'Tropical moist',
  'tropical-dry': 'Tropical dry',
  'warm-temperate-moist': 'Warm temperate moist',
  'warm-temperate-dry': 'Warm temperate dry',
  'cool-temperate-moist': 'Cool temperate moist',
  'cool-temperate-dry': 'Cool temperate dry',
  'boreal-moist': 'Boreal moist',
  'boreal-dry': 'Boreal dry',
  'polar-moist': 'Polar moist',
  'polar-dry': 'Polar dry',
};

export const SOIL_LABELS: Record<SoilType, string> = {
  hac: 'High-activity clay (HAC)',
  lac: 'Low-activity clay (LAC)',
  sandy: 'Sandy',
  spodic: 'Spodic',
  volcanic: 'Volcanic',
  wetland: 'Wetland (mineral)',
  organic: 'Organic (peat), drained',
};

export const MANAGEMENT_LABELS: Record<GrasslandManagement, string> = {
  nominal: 'Nominally managed (not degraded)',
  'moderately-degraded': 'Moderately degraded',
  'severely-degraded': 'Severely degraded',
  improved: 'Improved',
};

export const GRASS_INPUT_LABELS: Record<GrasslandInput, string> = { medium: 'Medium', high: 'High (improved only)' };

export const SYSTEM_LABELS: Record<CroplandSystem, string> = {
  'long-term-cultivated': 'Long-term cultivated (annual crops)',
  'paddy-rice': 'Paddy rice',
  perennial: 'Perennial or tree crop',
  'set-aside': 'Set-aside (< 20 years)',
};

export const TILLAGE_LABELS: Record<Tillage, string> = {
  full: 'Full tillage',
  reduced: 'Reduced tillage',
  none: 'No tillage',
};

export const CROP_INPUT_LABELS: Record<CroplandInput, string> = {
  low: 'Low',
  medium: 'Medium',
  'high-without-manure': 'High, without manure',
  'high-with-manure': 'High, with manure',
};

export const GWP_LABELS: Record<GwpSet, string> = {
  ar4: 'AR4 (100-year)',
  ar5: 'AR5 (100-year)',
  ar6: 'AR6 (100-year)',
};

export function formatNumber(x: number, digits = 1): string {
  return x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });
}
