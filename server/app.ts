import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { Database } from './db/client';
import { createAuth } from './lib/auth';
import type { FakeSmtp } from './lib/fake-services';
import type { Mailer } from './lib/mail';
import type { Storage } from './lib/storage';
import { logger } from './lib/logger';
import { authenticate } from './middleware/authenticate';
import { errorHandler, JSON_SHAPE_ERROR, notFoundHandler } from './middleware/error-handler';
import { hostCheck, originCheck } from './middleware/origin-check';
import { requestLog } from './middleware/request-log';
import { createAuthRateLimits } from './middleware/rate-limit';
import { wellFormedInput } from './middleware/validate';
import { checkJsonShape } from '../shared/schemas/text';
import { accountRoutes } from './modules/account/account.routes';
import { evaluateAlertsAfterWrites } from './modules/alerts/after-writes';
import { alertsRoutes } from './modules/alerts/alerts.routes';
import { createAlertsService, type AlertsService } from './modules/alerts/alerts.service';
import { createCalendarService } from './modules/alerts/calendar.service';
import { createAccountService } from './modules/account/account.service';
import { authRoutes } from './modules/auth/auth.routes';
import { createAuthService } from './modules/auth/auth.service';
import { createRateLimitRepository } from './modules/auth/rate-limit.repository';
import { calcRoutes } from './modules/calc/calc.routes';
import { appInfoRoutes } from './modules/health/app-info.routes';
import { healthRoutes } from './modules/health/health.routes';
import { outboxRoutes } from './modules/outbox/outbox.routes';
import { invitationRoutes, teamRoutes } from './modules/team/team.routes';
import { auditRoutes } from './modules/audit/audit.routes';
import { createAnswerCache } from './middleware/answer-cache';
import { routeBySegment } from './lib/route-by-segment';
import { exportRoutes } from './modules/export/export.routes';
import { attachmentsRoutes } from './modules/attachments/attachments.routes';
import { cartridgesRoutes } from './modules/cartridges/cartridges.routes';
import { cellarRoutes } from './modules/cellar/cellar.routes';
import { equipmentRoutes } from './modules/equipment/equipment.routes';
import type { ModuleDeps } from './modules/module-deps';
import { plansRoutes } from './modules/plans/plans.routes';
import { hosePresetsRoutes } from './modules/hose-presets/hose-presets.routes';
import { careRoutes } from './modules/care/care.routes';
import { runsRoutes } from './modules/runs/runs.routes';
import { loggerRoutes } from './modules/logger/logger.routes';
import { recordsRoutes } from './modules/records/records.routes';
import { archiveRoutes } from './modules/archive/archive.routes';
import { todayRoutes } from './modules/today/today.routes';
import { winerySettingsRoutes } from './modules/winery-settings/winery-settings.routes';
import { createTeamService } from './modules/team/team.service';

export type AppConfig = {
  /** Public base URL used in e-mailed links, e.g. http://127.0.0.1:3000 */
  appUrl: string;
  /** Extra origins allowed to make state-changing requests (the app's own host is always allowed). */
  allowedOrigins: string[];
  secureCookies: boolean;
  /** Multiplies the auth rate limits (1 in production). */
  rateLimitScale: number;
  /**
   * Prefix of this app's rate-limit counters in the shared table ('' in production, where every
   * instance counts together); test apps on one database take their own unless they share on purpose.
   */
  rateLimitNamespace?: string;
  /** Memory for read answers kept in this process (default 32 MB; 0 keeps none). */
  answerCacheBytes?: number;
  /** Express "trust proxy" (behind a reverse proxy the client address comes from X-Forwarded-For). */
  trustProxy?: string;
  /** Folder with the built client to serve, if any. */
  clientDir?: string;
  logRequests: boolean;
};

export type AppDeps = {
  db: Database;
  mailer: Mailer;
  storage: Storage;
  config: AppConfig;
  /** The fake SMTP server in development: enables the mail outbox page. */
  outbox?: FakeSmtp;
  /** The secret that opens the development outbox without signing in (printed by `npm start`). */
  outboxKey?: string;
  /** The alerts service shared with the workers (made here when absent). */
  alerts?: AlertsService;
  /** Set `draining` when shutting down: /api/health/ready then answers 503. */
  lifecycle?: { draining: boolean };
};

export const JSON_BODY_LIMIT = '1mb';

/** Browser features Porewise never uses, switched off for the app and anything it might embed. */
export const PERMISSIONS_POLICY =
  'accelerometer=(), autoplay=(), camera=(), display-capture=(), geolocation=(), gyroscope=(), magnetometer=(), microphone=(), midi=(), payment=(), usb=(), browsing-topics=()';

export function createApp(deps: AppDeps): Express {
  const { db, mailer, config } = deps;
  const auth = createAuth(db, { secureCookies: config.secureCookies });
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', parseTrustProxy(config.trustProxy));

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          // Styles and fonts only from this origin: no https: wildcard, no inline <style>. React and
          // recharts set style attributes through the CSSOM, which a CSP does not restrict.
          'style-src': ["'self'"],
          'font-src': ["'self'"],
          'upgrade-insecure-requests': config.secureCookies ? [] : null,
        },
      },
      strictTransportSecurity: false,
    }),
  );
  app.use((req, res, next) => {
    res.set('Permissions-Policy', PERMISSIONS_POLICY);
    // HSTS only when the answer travels over HTTPS (directly, or via a trusted proxy's X-Forwarded-Proto).
    if (req.secure) res.set('Strict-Transport-Security', 'max-age=31536000; includeSubDomains');
    next();
  });
  if (config.logRequests) app.use(requestLog(logger));
  // gzip or brotli for every text answer (API and client files) the browser accepts.
  app.use(compression());

  const api = express.Router();
  api.use(express.json({ limit: JSON_BODY_LIMIT, verify: refuseComplexJson }));
  api.use(wellFormedInput);
  api.use(hostCheck([config.appUrl, ...config.allowedOrigins]));
  api.use(originCheck([config.appUrl, ...config.allowedOrigins]));
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  // Before authenticate: health answers {db:false} even with a session cookie while the database is away.
  api.use('/health', healthRoutes({ db, lifecycle: deps.lifecycle }));
  api.use(authenticate(auth));

  const alerts = deps.alerts ?? createAlertsService({ db, mailer, appUrl: config.appUrl });
  app.locals.alerts = alerts;
  api.use(evaluateAlertsAfterWrites(alerts));

  const limits = createAuthRateLimits(createRateLimitRepository(db), config.rateLimitScale, config.rateLimitNamespace);
  const authService = createAuthService({ db, auth, mailer, appUrl: config.appUrl });
  const teamService = createTeamService({ db, auth, mailer, appUrl: config.appUrl });

  api.use('/app-info', appInfoRoutes({ mailOutbox: Boolean(deps.outbox) }));
  api.use('/auth', authRoutes({ auth, service: authService, limits }));
  api.use('/me', accountRoutes({ service: createAccountService({ db }) }));
  api.use('/team', teamRoutes({ db, service: teamService }));
  api.use('/invitations', invitationRoutes({ auth, service: teamService }));
  api.use('/calc', calcRoutes({ db }));
  if (deps.outbox) api.use('/dev/outbox', outboxRoutes({ outbox: deps.outbox, db, key: deps.outboxKey }));
  // Domain modules declare their own paths (/tanks, /lots, /housings, …) and guard each one; each
  // request goes only to the modules with routes under its first path segment.
  const answers = createAnswerCache({ maxBytes: config.answerCacheBytes ?? 32 * 1024 * 1024 });
  app.locals.answers = answers;
  const moduleDeps: ModuleDeps = { db, storage: deps.storage, mailer, appUrl: config.appUrl, answers };
  api.use(
    routeBySegment([
      cellarRoutes(moduleDeps),
      equipmentRoutes(moduleDeps),
      cartridgesRoutes(moduleDeps),
      attachmentsRoutes(moduleDeps),
      winerySettingsRoutes(moduleDeps),
      todayRoutes(moduleDeps),
      plansRoutes(moduleDeps),
      hosePresetsRoutes(moduleDeps),
      careRoutes(moduleDeps),
      runsRoutes(moduleDeps),
      loggerRoutes(moduleDeps),
      recordsRoutes(moduleDeps),
      alertsRoutes({ db, service: alerts, calendar: createCalendarService({ db, appUrl: config.appUrl }) }),
      auditRoutes(moduleDeps),
      exportRoutes(moduleDeps),
      archiveRoutes(moduleDeps),
    ]),
  );
  api.use(notFoundHandler);
  app.use('/api', api);

  if (config.clientDir && existsSync(join(config.clientDir, 'index.html'))) {
    const clientDir = config.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h', setHeaders: noCacheForHtml }));
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.set('Cache-Control', 'no-cache');
      res.sendFile(join(clientDir, 'index.html'), { dotfiles: 'allow' });
    });
  }

  app.use(errorHandler);
  return app;
}

/** Refuses a JSON body nested too deeply or with too many items before it is parsed (one pass, no recursion). */
function refuseComplexJson(_req: unknown, _res: unknown, buf: Buffer) {
  const problem = checkJsonShape(buf);
  if (problem) throw Object.assign(new Error(problem.message), { status: 400, expose: true, type: JSON_SHAPE_ERROR });
}

function parseTrustProxy(value: string | undefined): boolean | number | string {
  if (!value) return false;
  if (/^\d+$/.test(value)) return Number(value);
  if (value === 'true' || value === 'false') return value === 'true';
  return value;
}

function noCacheForHtml(res: import('express').Response, path: string) {
  // The service worker and the manifest are checked on every visit, so updates reach phones.
  if (path.endsWith('.html') || path.endsWith('/sw.js') || path.endsWith('.webmanifest')) res.setHeader('Cache-Control', 'no-cache');
  else if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
