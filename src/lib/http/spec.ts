/**
 * An API route's contract: path, method, who may call it and its zod schemas. The same object
 * drives the handler (lib/http/handle.ts), the OpenAPI document and the role-matrix test.
 */
import type { z } from 'zod';
import type { Role } from '../auth/roles';

export type Access = 'public' | 'signed-in' | readonly Role[];
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type ApiSpec<
  B extends z.ZodType | undefined = z.ZodType | undefined,
  Q extends z.ZodType | undefined = z.ZodType | undefined,
  P extends z.ZodType | undefined = z.ZodType | undefined,
> = {
  method: Method;
  /** OpenAPI-style path, e.g. /api/users/{id} */
  path: string;
  summary: string;
  tag: string;
  access: Access;
  body?: B;
  query?: Q;
  params?: P;
  /** Schema of the success body; null for 204 or a non-JSON body (described by responseType). */
  response: z.ZodType | null;
  status?: number;
  /** Content type of a non-JSON success body (e.g. a vector tile or CSV). */
  responseType?: string;
  /** Multipart upload instead of a JSON body. */
  multipart?: boolean;
};

export function defineSpec<
  B extends z.ZodType | undefined = undefined,
  Q extends z.ZodType | undefined = undefined,
  P extends z.ZodType | undefined = undefined,
>(spec: ApiSpec<B, Q, P>): ApiSpec<B, Q, P> {
  return spec;
}
