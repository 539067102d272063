import { publishReferenceLayer } from '~/lib/api/parcels';
import { handle } from '~/lib/http/handle';
import { publishLayerVersion } from '~/lib/services/reference-layers';

export const POST = handle(publishReferenceLayer, async ({ user, params, body }) =>
  publishLayerVersion(user, params.id, body.note ?? null),
);
