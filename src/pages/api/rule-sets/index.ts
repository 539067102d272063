import { cloneRuleSet, listRuleSets } from '~/lib/api/rule-sets';
import { handle } from '~/lib/http/handle';
import { listRuleSetSummaries } from '~/lib/services/rule-set-views';
import { cloneRuleSet as clone } from '~/lib/services/rule-sets';

export const GET = handle(listRuleSets, async () => ({ items: await listRuleSetSummaries() }));

export const POST = handle(cloneRuleSet, async ({ user, body }) =>
  clone(user, {
    fromId: body.from.id,
    fromVersion: body.from.version,
    id: body.id,
    title: body.title,
    description: body.description,
    reason: body.reason,
  }),
);
