import { recordEvent } from '~/lib/api/parcels';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { recordEvent as record } from '~/lib/services/parcels';

export const POST = handle(recordEvent, async ({ user, params, body }) =>
  json(await record(user, params.id, body), 201),
);
