import { getAttachment } from '~/lib/api/proposals';
import { handle } from '~/lib/http/handle';
import { readAttachment } from '~/lib/services/proposals';

/** Sent as a download with its checked type; never rendered inline, so nothing in it can run in our origin. */
export const GET = handle(getAttachment, async ({ params }) => {
  const a = await readAttachment(params.id, params.attachmentId);
  const name = a.file_name.replace(/[^\w.\- ]+/g, '_');
  return new Response(new Uint8Array(a.bytes), {
    status: 200,
    headers: {
      'content-type': a.media_type,
      'content-disposition': `attachment; filename="${name}"`,
      'x-content-type-options': 'nosniff',
      'cache-control': 'private, no-store',
      'repr-digest': `sha-256=:${Buffer.from(a.sha256, 'hex').toString('base64')}:`, // RFC 9530
    },
  });
});
