/** A region's facts for grading one proposal (pure), from its figures today and its reference ratio. */
import type { RegionFacts } from './facts';

export type ReferenceRatioInput = { ratio: number; referenceYear: number } | null;

/**
 * ratioNow = permanent grassland / agricultural area; ratioAfter removes the permanent grassland
 * the proposal converts (and any area it takes out of agriculture, e.g. to woodland);
 * relativeFallAfter = (reference - after) / reference.
 */
export function regionFacts(
  figures: { key: string; label: string; agriculturalHa: number; permanentGrasslandHa: number },
  reference: ReferenceRatioInput,
  convertedHa: number,
  leavesAgricultureHa = 0,
): RegionFacts {
  const agriAfter = figures.agriculturalHa - leavesAgricultureHa;
  const ratioNow = figures.agriculturalHa > 0 ? figures.permanentGrasslandHa / figures.agriculturalHa : null;
  const ratioAfter = agriAfter > 0 ? Math.max(0, figures.permanentGrasslandHa - convertedHa) / agriAfter : null;
  const ref = reference && reference.ratio > 0 ? reference : null;
  return {
    key: figures.key,
    label: figures.label,
    agriculturalHa: figures.agriculturalHa,
    permanentGrasslandHa: figures.permanentGrasslandHa,
    ratioNow,
    ratioAfter,
    referenceRatio: reference?.ratio ?? null,
    referenceYear: reference?.referenceYear ?? null,
    relativeFallAfter: ref && ratioAfter !== null ? (ref.ratio - ratioAfter) / ref.ratio : null,
    convertedHa,
  };
}
