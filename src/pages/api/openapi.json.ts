import { openapi } from '~/lib/api/admin';
import { buildOpenApiDocument } from '~/lib/api/openapi';
import { handle } from '~/lib/http/handle';

export const GET = handle(openapi, async ({ ctx }) => buildOpenApiDocument(ctx.url.origin));
