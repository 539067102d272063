import type { UsedFactor } from './types';

/**
 * Stoichiometric conversions (molar masses C 12, N 14, O 16). These are not measured
 * factors and do not vary between factor sets, so they live in code, not in the sets.
 * - 44/12: t C -> t CO2 (2006 IPCC Guidelines Vol 4 Ch 2, used throughout for C stock changes).
 * - 44/28: t N2O-N -> t N2O (2006 Vol 4 Ch 11, Eq 11.1 and following; read in S1 of ipcc-tier1.md).
 */
export const C_TO_CO2 = 44 / 12;
export const N2O_N_TO_N2O = 44 / 28;

const stoichiometry = (table: string) => ({
  document: 'Stoichiometry (molar masses C 12, N 14, O 16), as used in the 2006 IPCC Guidelines',
  volume: 'Vol 4 (AFOLU)',
  table,
});

export const C_TO_CO2_FACTOR: UsedFactor = {
  key: 'constant/c-to-co2',
  value: C_TO_CO2,
  unit: 't CO2/t C',
  source: stoichiometry('Ch 2: carbon stock change to CO2 (44/12)'),
  status: 'confirmed',
  role: 'Converts carbon to CO2 (exact molar-mass ratio).',
};
export const N2O_N_TO_N2O_FACTOR: UsedFactor = {
  key: 'constant/n2o-n-to-n2o',
  value: N2O_N_TO_N2O,
  unit: 't N2O/t N2O-N',
  source: stoichiometry('Ch 11 Eq 11.1: N2O-N to N2O (44/28)'),
  status: 'confirmed',
  role: 'Converts N2O-N to N2O (exact molar-mass ratio).',
};
