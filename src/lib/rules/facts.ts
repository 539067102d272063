/**
 * What a risk rule can read about one proposal (pure data, built by the assessment service from
 * the overlay, the land-use history, the estimates and the register). Areas in hectares, carbon
 * in tonnes C, CO2e in tonnes CO2e (positive = emission), shares as fractions 0..1.
 */

/** Share and area of the assessed area inside one layer or class. */
export type ShareFacts = { share: number; areaHa: number };

export type ParcelFacts = {
  parcelId: number;
  reference: string;
  /** The area assessed: the whole parcel, or the drawn part of it. */
  areaHa: number;
  /** Holding reference (private; rules may group by it, reasons must not print it). */
  ownerRef: string | null;
  /** Accounting region (district) the parcel falls in by largest share, or null. */
  regionKey: string | null;
  /** Designated sensitive grassland (any class of the `sensitive` layer). */
  sensitive: ShareFacts;
  /** The never-tilled grassland reference layer (any class). */
  neverTilledLayer: ShareFacts;
  /** Each slope class of the `slope` layer present on the parcel, by class key. */
  slope: Record<string, ShareFacts>;
  /** Land-use flags derived from the parcel's recorded history. */
  flags: { permanentGrassland: boolean | null; uncultivated: boolean | null; neverTilled: boolean | null };
  /** Soil-carbon loss over the horizon, t C/ha (positive = loss, negative = gain). */
  socLossPerHa: number;
  /** Soil-carbon loss as a share of the starting mineral-soil stock (0..1; negative = gain). */
  socLossShare: number;
  co2eTotal: number;
};

export type RegionFacts = {
  key: string;
  label: string;
  agriculturalHa: number;
  permanentGrasslandHa: number;
  /** Permanent-grassland ratio today, before this proposal (null when no agricultural area). */
  ratioNow: number | null;
  /** The ratio if this proposal were carried out (its permanent grassland leaves the numerator). */
  ratioAfter: number | null;
  referenceRatio: number | null;
  referenceYear: number | null;
  /** Relative fall of ratioAfter below the reference: (ref - after) / ref; 0.06 = 6 % below. */
  relativeFallAfter: number | null;
  /** Permanent grassland this proposal converts in this region, ha. */
  convertedHa: number;
};

export type HoldingFacts = {
  /** Private; for grouping only. */
  ownerRef: string;
  windowYears: number;
  /** Permanent grassland converted on this holding by this proposal, ha. */
  thisProposalHa: number;
  /** Earlier proposals (submitted or later, not withdrawn or refused) and approved decisions on the holding within the window, ha. */
  earlierHa: number;
  cumulativeHa: number;
  /** References of the earlier proposals counted (public proposal references, not personal data). */
  earlierReferences: string[];
};

export type BudgetFacts = {
  year: number;
  /** The authority's CO2e budget for the year, t CO2e (null when none is set). */
  budgetT: number | null;
  /** Already committed by approved decisions that year, t CO2e. */
  committedT: number;
  /** Share of the year's budget this proposal would use (its CO2e / budget), or null. */
  proposalShare: number | null;
};

export type GradeFacts = {
  proposalReference: string;
  /** True when the proposal takes grassland out of grassland (e.g. to cropland). */
  converts: boolean;
  parcels: ParcelFacts[];
  totals: {
    areaHa: number;
    socLossPerHa: number;
    socLossShare: number;
    co2eTotal: number;
    /** Upper bound of the 95 % range of the total (joint Monte Carlo). */
    co2eHigh: number;
    permanentGrasslandConvertedHa: number;
  };
  regions: RegionFacts[];
  holdings: HoldingFacts[];
  budget: BudgetFacts;
};

export type GradeReason = {
  /** Rule id within its rule set. */
  rule: string;
  /** The law, guidance or policy and its article. */
  citation: string;
  /** Plain words with the figures that made the rule fire. */
  text: string;
  level: 1 | 2 | 3 | 4;
  /** A hard gate: sets the level whatever else holds. */
  gate: boolean;
};

export type Grade = {
  level: 1 | 2 | 3 | 4;
  label: string;
  reasons: GradeReason[];
  ruleSet: { id: string; version: number };
  /** Optional (added by the grader): rules that could not be decided for want of data, e.g. no reference ratio. */
  undecided?: { rule: string; citation: string; text: string }[];
};
