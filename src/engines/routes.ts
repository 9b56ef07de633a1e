/** The registry of routes, in report order. A new route is added here (see DEVELOPERS.md). */
import type { Route } from './route.js';
import { perturbationRoute } from './perturbation/route.js';
import { responseRoute } from './response/route.js';
import { forceBalanceRoute } from './force-balance/route.js';
import { exactRoute } from './exact/route.js';

/** Routes run by default, in order; the first is the reference the others are compared with. */
export const defaultRoutes: Route[] = [perturbationRoute, responseRoute, forceBalanceRoute];

/** Routes that run only when asked for (slow ones). */
export const optionalRoutes: Route[] = [exactRoute];

/** Every route, by name. */
export function routeByName(name: string): Route | undefined {
  return [...defaultRoutes, ...optionalRoutes].find((r) => r.name === name);
}

/** All route names. */
export const routeNames = (): string[] => [...defaultRoutes, ...optionalRoutes].map((r) => r.name);
