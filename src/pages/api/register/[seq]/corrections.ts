import { correctRegisterEntry } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { correctEntry } from '~/lib/services/register';

export const POST = handle(correctRegisterEntry, async ({ user, params, body }) =>
  correctEntry(user, params.seq, body),
);
