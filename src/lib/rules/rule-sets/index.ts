import { ruleSetDocumentSchema, type RuleSetDocument } from '../schema';
import defaultJson from './default.json';

/** The demo authority's rule set, shipped read-only and validated on import. */
export const TARROW_SCREENING: RuleSetDocument = ruleSetDocumentSchema.parse(defaultJson);

/** Id of the rule set used when no `default-rule-set` setting names another. */
export const DEFAULT_RULE_SET_ID = 'tarrow-screening';

export const BUILT_IN_RULE_SETS: readonly RuleSetDocument[] = [TARROW_SCREENING];
