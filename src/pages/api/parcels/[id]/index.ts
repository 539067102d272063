import { getParcel } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { parcelDetail } from '~/lib/services/parcels';

export const GET = handle(getParcel, async ({ user, params }) => parcelDetail(user, params.id));
