import { mapConfig } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { mapConfig as config } from '~/lib/services/map';

export const GET = handle(mapConfig, async ({ user }) => config(user.id));
