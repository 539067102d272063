import { cloneFactorSet, listFactorSets } from '~/lib/api/factor-sets';
import { handle } from '~/lib/http/handle';
import { listSetSummaries } from '~/lib/services/factor-set-views';
import { cloneSet } from '~/lib/services/factor-sets';

export const GET = handle(listFactorSets, async () => ({ items: await listSetSummaries() }));

export const POST = handle(cloneFactorSet, async ({ user, body }) =>
  cloneSet(user, {
    fromId: body.from.id,
    fromVersion: body.from.version,
    id: body.id,
    title: body.title,
    description: body.description,
    reason: body.reason,
  }),
);
