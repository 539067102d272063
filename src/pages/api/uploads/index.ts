import { stageUpload } from '~/lib/api/uploads';
import { db } from '~/lib/db/client';
import { getGisSettings } from '~/lib/db/gis-settings';
import { HttpError } from '~/lib/http/errors';
import { handle } from '~/lib/http/handle';
import { readUploadForm } from '~/lib/http/multipart';
import { stageUpload as stage } from '~/lib/services/upload-stage';

export const POST = handle(stageUpload, async ({ ctx, user }) => {
  const settings = await getGisSettings(db);
  const form = await readUploadForm(ctx.request, settings['upload.max-bytes']);
  const purpose = form.fields.purpose ?? 'parcels';
  if (purpose !== 'parcels' && purpose !== 'reference')
    throw new HttpError('UNPROCESSABLE_CONTENT', 'purpose must be "parcels" or "reference".', [
      { path: ['purpose'], message: 'invalid' },
    ]);
  const staged = await stage(user, { purpose, fileName: form.fileName, bytes: form.bytes });
  return new Response(JSON.stringify(staged), {
    status: 201,
    headers: { 'content-type': 'application/json; charset=utf-8' },
  });
});
