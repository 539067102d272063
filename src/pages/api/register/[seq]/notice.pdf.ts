import { registerNoticePdf } from '~/lib/api/board-pack';
import { handle } from '~/lib/http/handle';
import { decisionNoticePdf } from '~/lib/pdf/notice';
import { registerEntry } from '~/lib/services/register';

export const GET = handle(registerNoticePdf, async ({ params }) => {
  const pdf = await decisionNoticePdf(await registerEntry(params.seq));
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `inline; filename="decision-notice-${params.seq}.pdf"`,
      'cache-control': 'no-store',
    },
  });
});
