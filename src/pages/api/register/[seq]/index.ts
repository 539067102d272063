import { getRegisterEntry } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { registerEntry } from '~/lib/services/register';

export const GET = handle(getRegisterEntry, async ({ params }) => registerEntry(params.seq));
