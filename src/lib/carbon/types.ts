/**
 * Domain vocabulary of the carbon engine. Plain types and constant lists only: no I/O,
 * so browser islands and server code can share them.
 *
 * Terms follow the IPCC 2006 Guidelines, Vol 4 (AFOLU): climate regions of Ch 3 Annex 3A.5,
 * soil classes of Ch 2 Table 2.3 and Annex 3A.5, management levels of Ch 5 Table 5.5
 * (cropland) and Ch 6 Table 6.2 (grassland).
 */

/** The twelve IPCC default climate regions (2006 Vol 4 Ch 3 Annex 3A.5), kebab-case. */
export const CLIMATE_REGIONS = [
  'tropical-montane',
  'tropical-wet',
  'tropical-moist',
  'tropical-dry',
  'warm-temperate-moist',
  'warm-temperate-dry',
  'cool-temperate-moist',
  'cool-temperate-dry',
  'boreal-moist',
  'boreal-dry',
  'polar-moist',
  'polar-dry',
] as const;
export type ClimateRegion = (typeof CLIMATE_REGIONS)[number];

/** IPCC soil classes. `organic` (Histosols) uses drained-organic-soil emission factors, not SOC_REF. */
export const SOIL_TYPES = ['hac', 'lac', 'sandy', 'spodic', 'volcanic', 'wetland', 'organic'] as const;
export type SoilType = (typeof SOIL_TYPES)[number];
export type MineralSoilType = Exclude<SoilType, 'organic'>;
export const MINERAL_SOIL_TYPES = SOIL_TYPES.filter((s): s is MineralSoilType => s !== 'organic');

/** Grassland management levels, 2006 Vol 4 Ch 6 Table 6.2. */
export const GRASSLAND_MANAGEMENT = ['nominal', 'moderately-degraded', 'severely-degraded', 'improved'] as const;
export type GrasslandManagement = (typeof GRASSLAND_MANAGEMENT)[number];
/** Grassland input levels (F_I applies to improved grassland only; `high` only with `improved`). */
export const GRASSLAND_INPUT = ['medium', 'high'] as const;
export type GrasslandInput = (typeof GRASSLAND_INPUT)[number];

/** Cropland systems (F_LU levels), 2006 Vol 4 Ch 5 Table 5.5. */
export const CROPLAND_SYSTEMS = ['long-term-cultivated', 'paddy-rice', 'perennial', 'set-aside'] as const;
export type CroplandSystem = (typeof CROPLAND_SYSTEMS)[number];
/** Tillage (F_MG levels), Table 5.5: full, reduced, none (= no-till). */
export const TILLAGE = ['full', 'reduced', 'none'] as const;
export type Tillage = (typeof TILLAGE)[number];
/** Cropland input (F_I levels), Table 5.5. */
export const CROPLAND_INPUT = ['low', 'medium', 'high-without-manure', 'high-with-manure'] as const;
export type CroplandInput = (typeof CROPLAND_INPUT)[number];

export interface GrasslandState {
  landUse: 'grassland';
  management: GrasslandManagement;
  input: GrasslandInput;
}
export interface CroplandState {
  landUse: 'cropland';
  system: CroplandSystem;
  tillage: Tillage;
  input: CroplandInput;
}
export type LandUseState = GrasslandState | CroplandState;

/** GWP sets (100-year): IPCC AR4, AR5 (without climate-carbon feedback), AR6. */
export const GWP_SETS = ['ar4', 'ar5', 'ar6'] as const;
export type GwpSet = (typeof GWP_SETS)[number];

/** Confirmation status of a stored value. */
export const VALUE_STATUSES = ['confirmed', 'unconfirmed', 'not-applicable'] as const;
export type ValueStatus = (typeof VALUE_STATUSES)[number];

/** Confidence markers of the team reference (ipcc-tier1.md): read, cross-checked, memory high/low. */
export const CONFIDENCE_MARKERS = ['V', 'X', 'M-H', 'M-L'] as const;
export type ConfidenceMarker = (typeof CONFIDENCE_MARKERS)[number];

/**
 * Where a used value was published, as reported in a result. Fields the set does not know
 * (e.g. `page`, until someone reads the value in the document) are left out, never null.
 */
export interface SourceRef {
  document: string;
  volume?: string;
  chapter?: string;
  table: string;
  page?: string;
}

/** One factor value the engine used, with its provenance (appears in the result's `factors`). */
export interface UsedFactor {
  /** `<table key>/<entry key>`, e.g. `soc-ref/cold-temperate-moist/hac`. */
  key: string;
  value: number;
  unit: string;
  source: SourceRef;
  status: 'confirmed' | 'unconfirmed';
  /** What the value was used for, in plain words. */
  role: string;
}
