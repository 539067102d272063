import { listReferenceLayers } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { listReferenceLayers as list } from '~/lib/services/reference-layers';

export const GET = handle(listReferenceLayers, async () => list());
