/**
 * Wraps an API handler in the steps every route shares: authenticate → authorise by role →
 * parse params, query and body with the spec's zod schemas → run → answer in the one JSON
 * shape. Handlers stay a few lines long and never see unparsed input.
 */
import type { APIContext, APIRoute } from 'astro';
import type { z } from 'zod';
import { hasAnyRole, type Role } from '../auth/roles';
import { errorResponse, HttpError, json, type Issue } from './errors';
import type { ApiSpec } from './spec';

// Optional spec fields read as `Schema | undefined`: infer from the schema when there is one.
type Infer<T> = [Exclude<T, undefined>] extends [never] ? undefined : Exclude<T, undefined> extends z.ZodType ? z.output<Exclude<T, undefined>> : undefined;

export type Caller = { id: string; name: string; email: string; roles: Role[] };

export type HandlerInput<S extends ApiSpec> = {
  ctx: APIContext;
  user: S['access'] extends 'public' ? Caller | null : Caller;
  body: Infer<S['body']>;
  query: Infer<S['query']>;
  params: Infer<S['params']>;
};

export const MAX_JSON_BYTES = 1_000_000;

export function zodIssues(error: z.ZodError): Issue[] {
  return error.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: i.message }));
}

function parse<T extends z.ZodType>(schema: T, value: unknown, where: string): z.output<T> {
  const r = schema.safeParse(value);
  if (!r.success) {
    const issues = zodIssues(r.error);
    const first = issues[0];
    const field = first?.path.length ? ` (${first.path.join('.')})` : '';
    throw new HttpError('UNPROCESSABLE_CONTENT', `Invalid ${where}${field}: ${first?.message ?? 'bad value'}`, issues);
  }
  return r.data;
}

async function readJson(request: Request): Promise<unknown> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.includes('application/json')) throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the request body as application/json.');
  const length = Number(request.headers.get('content-length') ?? 0);
  if (length > MAX_JSON_BYTES) throw new HttpError('PAYLOAD_TOO_LARGE', `The request body is larger than ${MAX_JSON_BYTES} bytes.`);
  const text = await request.text();
  if (text.length > MAX_JSON_BYTES) throw new HttpError('PAYLOAD_TOO_LARGE', `The request body is larger than ${MAX_JSON_BYTES} bytes.`);
  try {
    return JSON.parse(text);
  } catch {
    throw new HttpError('BAD_REQUEST', 'The request body is not valid JSON.');
  }
}

export function authorise(spec: ApiSpec, user: Caller | null): void {
  if (spec.access === 'public') return;
  if (!user) throw new HttpError('UNAUTHORIZED', 'Sign in to use this.');
  if (spec.access !== 'signed-in' && !hasAnyRole(user.roles, spec.access)) {
    throw new HttpError('FORBIDDEN', `This needs one of the roles: ${spec.access.join(', ')}.`);
  }
}

export function handle<S extends ApiSpec>(spec: S, fn: (input: HandlerInput<S>) => Promise<unknown>): APIRoute {
  return async (ctx) => {
    try {
      const user = ctx.locals.user;
      authorise(spec, user);
      const params = spec.params ? parse(spec.params, ctx.params, 'path parameter') : undefined;
      const query = spec.query ? parse(spec.query, Object.fromEntries(ctx.url.searchParams), 'query') : undefined;
      const body = spec.body && !spec.multipart ? parse(spec.body, await readJson(ctx.request), 'request') : undefined;
      const result = await fn({ ctx, user, body, query, params } as HandlerInput<S>);
      if (result instanceof Response) return result;
      if (result === undefined) return new Response(null, { status: 204 });
      return json(result, spec.status ?? 200);
    } catch (err) {
      if (err instanceof HttpError) return errorResponse(err.code, err.message, err.issues);
      console.error(`${ctx.request.method} ${ctx.url.pathname} failed:`, err);
      return errorResponse('INTERNAL_SERVER_ERROR', 'Something went wrong on the server. The error has been logged.');
    }
  };
}
