import type { NextFunction, RequestHandler, Router } from 'express';

/** `/runs/:id/close` → `runs` (Express matches paths without regard to case). */
function firstSegment(path: string): string {
  const end = path.indexOf('/', 1);
  return (end === -1 ? path.slice(1) : path.slice(1, end)).toLowerCase();
}

/**
 * The domain routers declare full paths (`/runs/:id`, `/plans`, …) and sit side by side under
 * /api. Express would try every route of every router in turn on each request; this hands a
 * request only to the routers holding a route under its first path segment, in the order given
 * — the same answers with far less matching. A router with anything but plain routes whose
 * path starts with a fixed segment is refused at start-up, so nothing can be skipped by mistake.
 */
export function routeBySegment(routers: Router[]): RequestHandler & { readonly routers: readonly Router[] } {
  const table = new Map<string, Router[]>();
  for (const router of routers) {
    for (const layer of router.stack) {
      const path: unknown = layer.route?.path;
      const segment = typeof path === 'string' && path.startsWith('/') ? firstSegment(path) : '';
      if (!/^[a-z0-9-]+$/.test(segment)) throw new Error(`routeBySegment: a route must start with a fixed path segment (found ${String(path)})`);
      const list = table.get(segment) ?? [];
      if (!list.includes(router)) list.push(router);
      table.set(segment, list);
    }
  }
  const dispatch: RequestHandler = (req, res, next) => {
    const list = table.get(firstSegment(req.path));
    if (!list) return next();
    let i = 0;
    const step: NextFunction = (err?: unknown) => {
      if (err !== undefined && err !== null && err !== 'router') return next(err);
      const router = list[i++];
      if (!router) return next();
      router(req, res, step);
    };
    step();
  };
  // The routers stay readable, for tools that walk the route table (tests/integration/fuzz.test.ts).
  return Object.assign(dispatch, { routers });
}
