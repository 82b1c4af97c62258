import type { RequestHandler } from 'express';
import type { TenantContext } from '../../middleware/authorize';
import type { AlertsService } from './alerts.service';

/**
 * Writes after which the stock rule is checked at once as well: a plan approved, reopened or
 * marked done, and cartridges received, retired or deleted. Otherwise the stock rule runs once a
 * day (see `stockCheck`), not after every change. Paths as mounted under `/api`.
 */
const STOCK_WRITES: readonly RegExp[] = [/^\/plans\/[^/]+\/(approve|reopen|done)$/, /^\/cartridges(\/import)?$/, /^\/cartridges\/[^/]+(\/retire)?$/];

/** True when a write to this path (under /api) should re-check the stock rule at once. */
export function checksStock(path: string): boolean {
  return STOCK_WRITES.some((re) => re.test(path));
}

/**
 * After a successful change in a winery (any method but GET/HEAD), the winery's alert rules are
 * evaluated at once, so a failed integrity test or an approval raises its alert without waiting
 * for the scheduled sweep. Evaluations of one winery are coalesced.
 */
export function evaluateAlertsAfterWrites(alerts: Pick<AlertsService, 'evaluateSoon'>): RequestHandler {
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      const path = req.path;
      res.on('finish', () => {
        const tenant = res.locals.tenant as TenantContext | undefined;
        if (tenant && res.statusCode < 400) alerts.evaluateSoon(tenant.wineryId, { stock: checksStock(path) });
      });
    }
    next();
  };
}
