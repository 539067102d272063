import { factorSetDocumentSchema, type FactorSetDocument } from '../factor-set-schema';
import ipcc2006Json from './ipcc-2006.json';
import ipcc2019Json from './ipcc-2019.json';

/**
 * The two read-only sets shipped with Swardkeep, validated on import.
 * - ipcc-2006.json: 2006 IPCC Guidelines Tier 1 defaults (the default set).
 * - ipcc-2019.json: 2019 Refinement Tier 1 defaults (mostly unconfirmed, exploration only).
 */
export const IPCC_2006: FactorSetDocument = factorSetDocumentSchema.parse(ipcc2006Json);
export const IPCC_2019: FactorSetDocument = factorSetDocumentSchema.parse(ipcc2019Json);

/** Id of the set used when a request names none. */
export const DEFAULT_FACTOR_SET_ID = 'ipcc-2006';

export const BUILT_IN_FACTOR_SETS: readonly FactorSetDocument[] = [IPCC_2006, IPCC_2019];

/** A shipped set by id, or undefined (custom sets live in the database). */
export function builtInFactorSet(id: string): FactorSetDocument | undefined {
  return BUILT_IN_FACTOR_SETS.find((s) => s.id === id);
}
