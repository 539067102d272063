import { uploadOnMap as spec } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { uploadOnMap } from '~/lib/services/map';

export const GET = handle(spec, async ({ params }) => uploadOnMap(params.id));
