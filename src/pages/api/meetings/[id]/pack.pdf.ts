import { getMeetingPackPdf } from '~/lib/api/board-pack';
import { handle } from '~/lib/http/handle';
import { boardPackPdf } from '~/lib/pdf/board-pack';
import { meetingPacks } from '~/lib/services/board-pack';

export const GET = handle(getMeetingPackPdf, async ({ params }) => {
  const { meeting, packs } = await meetingPacks(params.id);
  const pdf = await boardPackPdf(meeting, packs);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `inline; filename="board-pack-${meeting.date}.pdf"`,
      'cache-control': 'private, no-store',
    },
  });
});
