import { addFollowUpEvidence } from '~/lib/api/follow-ups';
import { db } from '~/lib/db/client';
import { getProposalSettings } from '~/lib/db/proposals';
import { json } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { readUploadForm } from '~/lib/http/multipart';
import { addEvidence } from '~/lib/services/follow-ups';

export const POST = handle(addFollowUpEvidence, async ({ ctx, user, params }) => {
  const settings = await getProposalSettings(db);
  const form = await readUploadForm(ctx.request, settings['proposal.attachment-max-bytes']);
  return json(await addEvidence(user, params.id, { fileName: form.fileName, bytes: form.bytes }), 201);
});
