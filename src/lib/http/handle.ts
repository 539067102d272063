/**
 * Wraps an API handler in the steps every route shares: authenticate → authorise by role →
 * parse params, query and body with the spec's zod schemas → run → answer in the one JSON
 * shape. Handlers stay a few lines long and never see unparsed input.
 */
import type { APIContext, APIRoute } from 'astro';
import type { z } from 'zod';
import { hasAnyRole, type Role } from '../auth/roles';
import { readJson, rejectNul } from './body';
import { errorResponse, HttpError, json, type Issue } from './errors';
import type { ApiSpec } from './spec';
import { logger } from '../log.mjs';
import { requestRecord } from '../request-context';

// Optional spec fields read as `Schema | undefined`: infer from the schema when there is one.
type Infer<T> = [Exclude<T, undefined>] extends [never]
  ? undefined
  : Exclude<T, undefined> extends z.ZodType
    ? z.output<Exclude<T, undefined>>
    : undefined;

export type Caller = { id: string; name: string; email: string; roles: Role[] };

export type HandlerInput<S extends ApiSpec> = {
  ctx: APIContext;
  user: S['access'] extends 'public' ? Caller | null : Caller;
  body: Infer<S['body']>;
  query: Infer<S['query']>;
  params: Infer<S['params']>;
};

export { MAX_JSON_BYTES } from './body';
/** Whole numbers in requests fit PostgreSQL's integer; bigger ones are refused at the edge (422), not by the database (500). */
export const MAX_INT = 2_147_483_647;

export function zodIssues(error: z.ZodError): Issue[] {
  return error.issues.map((i) => ({
    path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)),
    message: i.message,
  }));
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

/** Refuses whole numbers outside PostgreSQL's integer range anywhere in parsed input. */
function checkIntegers(value: unknown, where: string, path: (string | number)[] = []): void {
  if (typeof value === 'number' && Number.isInteger(value) && Math.abs(value) > MAX_INT) {
    const at = path.length ? ` (${path.join('.')})` : '';
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `Invalid ${where}${at}: whole numbers must lie between -${MAX_INT} and ${MAX_INT}.`,
      [{ path: [...path], message: 'out of range' }],
    );
  }
  // `path` is pushed and popped on the way down (copied only for the error).
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      if (!(i in value)) continue;
      path.push(i);
      checkIntegers(value[i], where, path);
      path.pop();
    }
  } else if (value && typeof value === 'object' && !(value instanceof Date)) {
    const o = value as Record<string, unknown>;
    for (const k of Object.keys(o)) {
      path.push(k);
      checkIntegers(o[k], where, path);
      path.pop();
    }
  }
}

function edge<T>(value: T, where: string): T {
  checkIntegers(value, where);
  return value;
}

/** PostgreSQL errors that mean bad input slipped past the schemas: a clear 4xx, never a 500. */
function inputErrorOf(err: unknown): HttpError | null {
  const code = (err as { code?: unknown })?.code;
  if (code === '22003') return new HttpError('UNPROCESSABLE_CONTENT', 'A number in the request is out of range.');
  if (code === '22021' || code === '22P05')
    return new HttpError('BAD_REQUEST', 'The request contains a character that cannot be stored (such as NUL).');
  return null;
}

export function authorise(spec: ApiSpec, user: Caller | null): void {
  if (spec.access === 'public') return;
  if (!user) throw new HttpError('UNAUTHORIZED', 'Sign in to use this.');
  if (spec.access !== 'signed-in' && !hasAnyRole(user.roles, spec.access)) {
    throw new HttpError('FORBIDDEN', `This needs one of the roles: ${spec.access.join(', ')}.`);
  }
}

/** What handle() reads of a request, so the direct lane (direct-lane.ts) runs the very same steps. */
export type RequestParts = {
  method: string;
  user: Caller | null;
  params: Record<string, string | undefined>;
  search: URLSearchParams;
  /** The parsed JSON body (readJson's checks: media type, size cap, valid UTF-8 JSON, no NUL). */
  readBody: () => Promise<unknown>;
};

/** Authorise → parse params, query and body with the spec's schemas; throws HttpError when refused. */
async function checkedInput<S extends ApiSpec>(spec: S, parts: RequestParts): Promise<Omit<HandlerInput<S>, 'ctx'>> {
  const user = parts.user;
  authorise(spec, user);
  rejectNul(parts.params, ['path']);
  const search = Object.fromEntries(parts.search);
  rejectNul(search, ['query']);
  const params = spec.params ? edge(parse(spec.params, parts.params, 'path parameter'), 'path parameter') : undefined;
  const query = spec.query ? edge(parse(spec.query, search, 'query'), 'query') : undefined;
  const body =
    spec.body && !spec.multipart ? edge(parse(spec.body, await parts.readBody(), 'request'), 'request') : undefined;
  return { user, body, query, params } as Omit<HandlerInput<S>, 'ctx'>;
}

/** The answer for a thrown error: its own status for a known one, else a logged 500. */
export function failure(err: unknown, spec: ApiSpec, method: string): Response {
  const known = err instanceof HttpError ? err : inputErrorOf(err);
  if (known) return errorResponse(known.code, known.message, known.issues);
  const record = requestRecord();
  logger.error({ reqId: record?.id, method, route: record?.route ?? spec.path, err }, 'request failed');
  return errorResponse('INTERNAL_SERVER_ERROR', 'Something went wrong on the server. The error has been logged.');
}

export function handle<S extends ApiSpec>(spec: S, fn: (input: HandlerInput<S>) => Promise<unknown>): APIRoute {
  return async (ctx) => {
    try {
      const input = await checkedInput(spec, {
        method: ctx.request.method,
        user: ctx.locals.user,
        params: ctx.params,
        search: ctx.url.searchParams,
        readBody: () => readJson(ctx.request),
      });
      const result = await fn({ ctx, ...input } as HandlerInput<S>);
      if (result instanceof Response) return result;
      if (result === undefined) return new Response(null, { status: 204 });
      return json(result, spec.status ?? 200);
    } catch (err) {
      return failure(err, spec, ctx.request.method);
    }
  };
}

/** A handler that needs nothing of Astro's context: it may also be served by the direct lane. */
export type PlainHandler<S extends ApiSpec> = (input: Omit<HandlerInput<S>, 'ctx'>) => Promise<unknown>;

/**
 * handle() for the direct lane: the same checks and error answers, the result as JSON text
 * (what json() would put in its Response) or a Response for anything else (errors, 204).
 */
export async function handlePlain<S extends ApiSpec>(
  spec: S,
  fn: PlainHandler<S>,
  parts: RequestParts,
): Promise<{ status: number; text: string } | Response> {
  try {
    const result = await fn(await checkedInput(spec, parts));
    if (result instanceof Response) return result;
    if (result === undefined) return new Response(null, { status: 204 });
    return { status: spec.status ?? 200, text: JSON.stringify(result) };
  } catch (err) {
    return failure(err, spec, parts.method);
  }
}
