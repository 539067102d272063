/** Risk grading by versioned rule sets (pure; no I/O). */
export type {
  Grade,
  GradeFacts,
  GradeReason,
  ParcelFacts,
  RegionFacts,
  HoldingFacts,
  BudgetFacts,
  ShareFacts,
} from './facts';
export { gradeProposal, holdingWindowYears, type RuleSetRef } from './grade';
export { LEVELS, RISK_LEVELS, levelInfo, type LevelInfo, type LevelShape, type RiskLevel } from './levels';
export { RULE_KINDS, RULE_KIND_LABELS, RULE_KIND_PARAMS, type RuleKind } from './rule-kinds';
export {
  citationText,
  ruleSchema,
  ruleSetDocumentSchema,
  ruleSetIdSchema,
  type Rule,
  type RuleSetDocument,
} from './schema';
export { diffRuleSets, sameJson, type RuleDifference } from './diff';
export { thresholdText } from './describe';
export { regionFacts, type ReferenceRatioInput } from './region-facts';
export { BUILT_IN_RULE_SETS, DEFAULT_RULE_SET_ID, TARROW_SCREENING } from './rule-sets';
