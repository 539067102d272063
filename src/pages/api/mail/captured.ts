import { listCapturedMail } from '~/lib/api/admin';
import { db } from '~/lib/db/client';
import { listCapturedMail as readMail } from '~/lib/db/mail-capture';
import { handle } from '~/lib/http/handle';

export const GET = handle(listCapturedMail, async ({ query }) => ({
  items: await readMail(db, { limit: query.limit, beforeId: query.before, to: query.to }),
}));
