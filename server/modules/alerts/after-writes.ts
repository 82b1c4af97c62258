import type { RequestHandler } from 'express';
import type { TenantContext } from '../../middleware/authorize';
import type { AlertsService } from './alerts.service';

/**
 * After a successful change in a winery (any method but GET/HEAD), the winery's alert rules are
 * evaluated at once, so a failed integrity test or an approval raises its alert without waiting
 * for the scheduled sweep. Evaluations of one winery are coalesced.
 */
export function evaluateAlertsAfterWrites(alerts: Pick<AlertsService, 'evaluateSoon'>): RequestHandler {
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.on('finish', () => {
        const tenant = res.locals.tenant as TenantContext | undefined;
        if (tenant && res.statusCode < 400) alerts.evaluateSoon(tenant.wineryId);
      });
    }
    next();
  };
}
