/**
 * Swardkeep carbon engine: IPCC Tier 1 estimates of land-use change on grassland.
 * Pure modules (no I/O, no clock, no global randomness): safe in browser islands and on the server.
 */
export * from './types';
export { CLIMATE_REGIMES, regimeFor, type ClimateRegime } from './climate-regimes';
export {
  estimateRequestSchema,
  estimateResultSchema,
  landUseStateSchema,
  grasslandStateSchema,
  croplandStateSchema,
  soilFractionSchema,
  uncertaintyRequestSchema,
  usedFactorSchema,
  FRACTION_SUM_TOLERANCE,
  MAX_UNCERTAINTY_RUNS,
  type EstimateRequest,
  type EstimateRequestInput,
  type EstimateResult,
} from './schemas';
export {
  factorSetDocumentSchema,
  factorTableSchema,
  factorEntrySchema,
  uncertaintySchema,
  confirmationSchema,
  entryStatus,
  type FactorSetDocument,
  type FactorTable,
  type FactorEntry,
  type Uncertainty,
} from './factor-set-schema';
export { estimateLandUseChange, estimateBatch, assertAllFinite } from './estimate';
export { EstimateInputError, type EstimateInputIssue } from './errors';
export { linearGroupKey, mergeLinearRequests } from './merge-requests';
export {
  runMonteCarlo,
  runJointMonteCarlo,
  jointSamplesPerItem,
  type JointItem,
  type MonteCarloResult,
} from './monte-carlo';
export { buildPlan, type Plan } from './plan';
export {
  diffFactorSets,
  unconfirmedTables,
  canSignOff,
  tablesUsed,
  type EntryDifference,
  type EntrySide,
} from './factor-set-diff';
export { STANDARD_CAUTIONS } from './cautions';
export { C_TO_CO2, N2O_N_TO_N2O } from './constants';
export { IPCC_2006, IPCC_2019, BUILT_IN_FACTOR_SETS, DEFAULT_FACTOR_SET_ID, builtInFactorSet } from './factor-sets';
