import { getFollowUpEvidence } from '~/lib/api/follow-ups';
import { handle } from '~/lib/http/handle';
import { readEvidence } from '~/lib/services/follow-ups';

/** Sent as a download with its checked type; never rendered inline, so nothing in it can run in our origin. */
export const GET = handle(getFollowUpEvidence, async ({ params }) => {
  const e = await readEvidence(params.id, params.evidenceId);
  const name = e.file_name.replace(/[^\w.\- ]+/g, '_');
  return new Response(new Uint8Array(e.bytes), {
    status: 200,
    headers: {
      'content-type': e.media_type,
      'content-disposition': `attachment; filename="${name}"`,
      'x-content-type-options': 'nosniff',
      'cache-control': 'private, no-store',
      'repr-digest': `sha-256=:${Buffer.from(e.sha256, 'hex').toString('base64')}:`, // RFC 9530
    },
  });
});
