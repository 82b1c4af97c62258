import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import 'pino-http'; // its type augmentation: `req.log`

/**
 * One log line per API request that changes something or fails (method, path, status,
 * milliseconds); successful reads are logged at debug only, so logging never dominates a
 * busy read path. `req.log` is the shared logger (no per-request child logger).
 */
export function requestLog(logger: Logger): RequestHandler {
  return (req, res, next) => {
    req.log = logger;
    if (!req.url.startsWith('/api')) return next();
    const start = process.hrtime.bigint();
    res.once('finish', () => {
      const quiet = (req.method === 'GET' || req.method === 'HEAD') && res.statusCode < 400;
      if (quiet && !logger.isLevelEnabled('debug')) return;
      const ms = Number(process.hrtime.bigint() - start) / 1e6;
      const line = { req: { method: req.method, url: req.originalUrl }, res: { statusCode: res.statusCode }, responseTime: Math.round(ms * 10) / 10 };
      if (quiet) logger.debug(line, 'request completed');
      else if (res.statusCode >= 500) logger.error(line, 'request failed');
      else logger.info(line, 'request completed');
    });
    next();
  };
}
