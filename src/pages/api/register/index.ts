import { listRegister } from '~/lib/api/register';
import { handle } from '~/lib/http/handle';
import { listRegister as list } from '~/lib/services/register';

export const GET = handle(listRegister, async ({ query }) => list({ ...query, current: query.current === 'true' }));
