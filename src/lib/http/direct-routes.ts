/**
 * Routes the direct lane may serve (direct-lane.ts): pure computations on a fixed path whose
 * handler needs nothing of Astro's context. Each is also an ordinary Astro route built from the
 * same contract and handler (`handle(route.spec, route.run)` in src/pages/api), so it appears in
 * /api/openapi.json and the role matrix and answers alike through either way in.
 */
import { createEstimate } from '../api/estimates';
import { runEstimate } from '../services/estimates';
import type { PlainHandler } from './handle';
import type { ApiSpec } from './spec';

export type DirectRoute<S extends ApiSpec = ApiSpec> = { spec: S; run: PlainHandler<S> };

function directRoute<S extends ApiSpec>(spec: S, run: PlainHandler<S>): DirectRoute<S> {
  if (spec.path.includes('{') || spec.multipart)
    throw new Error(`${spec.path}: the direct lane takes fixed JSON paths only`);
  return { spec, run };
}

/** POST /api/estimates: the carbon calculator. */
export const estimateRoute = directRoute(createEstimate, async ({ body }) => runEstimate(body));

export const DIRECT_ROUTES: DirectRoute[] = [estimateRoute as unknown as DirectRoute];
