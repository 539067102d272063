import { cancelUpload, uploadStatus } from '~/lib/api/uploads';
import { handle } from '~/lib/http/handle';
import { cancelUpload as cancel } from '~/lib/services/upload-stage';
import { uploadStatus as status } from '~/lib/services/upload-status';

export const DELETE = handle(cancelUpload, async ({ user, params }) => cancel(user, params.id));

export const GET = handle(uploadStatus, async ({ user, params }) => status(user, params.id));
