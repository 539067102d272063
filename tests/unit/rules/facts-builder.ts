/** Hand-built GradeFacts for the rule tests: one parcel, everything below every default threshold. */
import type { GradeFacts, ParcelFacts } from '~/lib/rules';

export const OWNER = 'HOLDING-SECRET-4471';

export function parcel(over: Partial<ParcelFacts> = {}): ParcelFacts {
  return {
    parcelId: 1,
    reference: 'CM-0101',
    areaHa: 1.5,
    ownerRef: OWNER,
    regionKey: 'north-vale',
    sensitive: { share: 0, areaHa: 0 },
    neverTilledLayer: { share: 0, areaHa: 0 },
    slope: { gentle: { share: 1, areaHa: 1.5 } },
    flags: { permanentGrassland: true, uncultivated: false, neverTilled: false },
    socLossPerHa: 5,
    socLossShare: 0.06,
    co2eTotal: 30,
    ...over,
  };
}

export function facts(
  over: {
    parcels?: ParcelFacts[];
    totals?: Partial<GradeFacts['totals']>;
    regions?: GradeFacts['regions'];
    holdings?: GradeFacts['holdings'];
    budget?: Partial<GradeFacts['budget']>;
  } = {},
): GradeFacts {
  return {
    proposalReference: 'PR-2026-0007',
    converts: true,
    parcels: over.parcels ?? [parcel()],
    totals: {
      areaHa: 1.5,
      socLossPerHa: 5,
      socLossShare: 0.06,
      co2eTotal: 30,
      co2eHigh: 45,
      permanentGrasslandConvertedHa: 1.5,
      ...over.totals,
    },
    regions: over.regions ?? [region()],
    holdings: over.holdings ?? [holding()],
    budget: { year: 2026, budgetT: 10_000, committedT: 2_000, proposalShare: 0.003, ...over.budget },
  };
}

export function region(over: Partial<GradeFacts['regions'][number]> = {}): GradeFacts['regions'][number] {
  return {
    key: 'north-vale',
    label: 'North Vale',
    agriculturalHa: 400,
    permanentGrasslandHa: 240,
    ratioNow: 0.6,
    ratioAfter: 0.59625,
    referenceRatio: 0.6,
    referenceYear: 2018,
    relativeFallAfter: 0.00625,
    convertedHa: 1.5,
    ...over,
  };
}

export function holding(over: Partial<GradeFacts['holdings'][number]> = {}): GradeFacts['holdings'][number] {
  return {
    ownerRef: OWNER,
    windowYears: 5,
    thisProposalHa: 1.5,
    earlierHa: 0,
    cumulativeHa: 1.5,
    earlierReferences: [],
    ...over,
  };
}
