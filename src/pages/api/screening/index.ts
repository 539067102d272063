import { listScreening } from '~/lib/api/screening';
import { handle } from '~/lib/http/handle';
import { screeningTable } from '~/lib/services/screening';

export const GET = handle(listScreening, async ({ query }) => screeningTable(query));
