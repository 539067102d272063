import { ready } from '~/lib/api/admin';
import { handle } from '~/lib/http/handle';
import { readiness } from '~/lib/services/readiness';

export const GET = handle(ready, () => readiness());
