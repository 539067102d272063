import { validateUpload } from '~/lib/api/uploads';
import { handle } from '~/lib/http/handle';
import { validateUpload as validate } from '~/lib/services/upload-validate';

export const POST = handle(validateUpload, async ({ user, params, body }) => validate(user, params.id, body));
