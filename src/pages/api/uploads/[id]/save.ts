import { saveUpload } from '~/lib/api/uploads';
import { handle } from '~/lib/http/handle';
import { json } from '~/lib/http/errors';
import { saveUpload as save } from '~/lib/services/upload-save';

export const POST = handle(saveUpload, async ({ user, params }) => json(await save(user, params.id), 201));
