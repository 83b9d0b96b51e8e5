import type { RequestHandler, Router } from 'express';
import { authenticate } from './authenticate';

/**
 * Reads an Express router's stack: to list every route (for the role × route test) and to tell
 * whether a request would reach a route (so the sign-in wall answers 401 for real routes while an
 * unknown path still gets its 404). Express does not document its stack; should its shape change,
 * the wall stops matching and every route still refuses through `currentUser(request)`, and the
 * role × route test fails loudly.
 */
interface StackLayer {
  readonly rawPath?: unknown;
  readonly handle: unknown;
  readonly route?: { readonly path: unknown; readonly methods: Record<string, boolean> };
  match(path: string): false | { path: string };
}

/** One route: its method in capitals and its full path as written, e.g. `GET /api/sites/:id`. */
export interface RouteEntry {
  readonly method: string;
  readonly path: string;
}

function stackOf(handle: unknown): readonly StackLayer[] | null {
  const stack = (handle as { stack?: unknown } | null)?.stack;
  return Array.isArray(stack) ? (stack as StackLayer[]) : null;
}

function routeHandles(route: NonNullable<StackLayer['route']>, method: string): boolean {
  const name = method.toLowerCase();
  return Boolean(route.methods[name] || route.methods['_all'] || (name === 'head' && route.methods['get']));
}

/** True when some route in the router, or in routers mounted inside it, handles this request. */
export function handlesRequest(router: unknown, method: string, path: string): boolean {
  for (const layer of stackOf(router) ?? []) {
    let match: false | { path: string };
    try {
      match = layer.match(path);
    } catch {
      // A malformed escape in the path: let the router itself answer it.
      return true;
    }
    if (!match) {
      continue;
    }
    if (layer.route) {
      if (routeHandles(layer.route, method)) {
        return true;
      }
    } else if (stackOf(layer.handle) && handlesRequest(layer.handle, method, path.slice(match.path.length) || '/')) {
      return true;
    }
  }
  return false;
}

/** Every route under the router, with mount prefixes joined on. */
export function listRoutes(router: unknown, prefix = ''): RouteEntry[] {
  const routes: RouteEntry[] = [];
  for (const layer of stackOf(router) ?? []) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      const methods = Object.keys(layer.route.methods).filter((method) => layer.route?.methods[method]);
      for (const path of paths) {
        for (const method of methods) {
          routes.push({ method: method === '_all' ? 'ALL' : method.toUpperCase(), path: `${prefix}${String(path)}` });
        }
      }
    } else if (stackOf(layer.handle)) {
      const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      routes.push(...listRoutes(layer.handle, `${prefix}${mount}`));
    }
  }
  return routes;
}

/**
 * The sign-in wall: requests that some route of `router` would handle must carry a valid access
 * token; anything else passes on (to the 404 answer).
 */
export function requireSignInFor(router: Router): RequestHandler {
  return (request, response, next) => {
    if (handlesRequest(router, request.method, request.path)) {
      authenticate(request, response, next);
    } else {
      next();
    }
  };
}
