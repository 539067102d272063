import { cancelUpload } from '~/lib/api/uploads';
import { handle } from '~/lib/http/handle';
import { cancelUpload as cancel } from '~/lib/services/upload-stage';

export const DELETE = handle(cancelUpload, async ({ user, params }) => cancel(user, params.id));
