import { uploadReportCsv } from '~/lib/api/uploads';
import { handle } from '~/lib/http/handle';
import { uploadReportCsv as report } from '~/lib/services/upload-validate';

export const GET = handle(uploadReportCsv, async ({ user, params }) => {
  const { fileName, body } = await report(user, params.id);
  return new Response(body, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${fileName}"`,
      'cache-control': 'no-store',
    },
  });
});
