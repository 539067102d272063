import { addAttachment } from '~/lib/api/proposals';
import { db } from '~/lib/db/client';
import { getProposalSettings } from '~/lib/db/proposals';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { readUploadForm } from '~/lib/http/multipart';
import { addAttachment as add } from '~/lib/services/proposals';

export const POST = handle(addAttachment, async ({ ctx, user, params }) => {
  const settings = await getProposalSettings(db);
  const form = await readUploadForm(ctx.request, settings['proposal.attachment-max-bytes']);
  return json(await add(user, params.id, { fileName: form.fileName, bytes: form.bytes }), 201);
});
