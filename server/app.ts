import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { pinoHttp } from 'pino-http';
import type { Database } from './db/client';
import { createAuth } from './lib/auth';
import type { FakeSmtp } from './lib/fake-services';
import type { Mailer } from './lib/mail';
import type { Storage } from './lib/storage';
import { logger } from './lib/logger';
import { authenticate } from './middleware/authenticate';
import { errorHandler, notFoundHandler } from './middleware/error-handler';
import { hostCheck, originCheck } from './middleware/origin-check';
import { createAuthRateLimits } from './middleware/rate-limit';
import { accountRoutes } from './modules/account/account.routes';
import { createAccountService } from './modules/account/account.service';
import { authRoutes } from './modules/auth/auth.routes';
import { createAuthService } from './modules/auth/auth.service';
import { calcRoutes } from './modules/calc/calc.routes';
import { appInfoRoutes } from './modules/health/app-info.routes';
import { healthRoutes } from './modules/health/health.routes';
import { outboxRoutes } from './modules/outbox/outbox.routes';
import { invitationRoutes, teamRoutes } from './modules/team/team.routes';
import { attachmentsRoutes } from './modules/attachments/attachments.routes';
import { cartridgesRoutes } from './modules/cartridges/cartridges.routes';
import { cellarRoutes } from './modules/cellar/cellar.routes';
import { equipmentRoutes } from './modules/equipment/equipment.routes';
import type { ModuleDeps } from './modules/module-deps';
import { plansRoutes } from './modules/plans/plans.routes';
import { careRoutes } from './modules/care/care.routes';
import { runsRoutes } from './modules/runs/runs.routes';
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
};

export const JSON_BODY_LIMIT = '1mb';

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
          'upgrade-insecure-requests': config.secureCookies ? [] : null,
        },
      },
      strictTransportSecurity: config.secureCookies,
    }),
  );
  if (config.logRequests) app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api') } }));

  const api = express.Router();
  api.use(express.json({ limit: JSON_BODY_LIMIT }));
  api.use(hostCheck([config.appUrl, ...config.allowedOrigins]));
  api.use(originCheck([config.appUrl, ...config.allowedOrigins]));
  api.use(authenticate(auth));
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });

  const limits = createAuthRateLimits(config.rateLimitScale);
  const authService = createAuthService({ db, auth, mailer, appUrl: config.appUrl });
  const teamService = createTeamService({ db, auth, mailer, appUrl: config.appUrl });

  api.use('/health', healthRoutes({ db }));
  api.use('/app-info', appInfoRoutes({ mailOutbox: Boolean(deps.outbox) }));
  api.use('/auth', authRoutes({ auth, service: authService, limits }));
  api.use('/me', accountRoutes({ service: createAccountService({ db }) }));
  api.use('/team', teamRoutes({ db, service: teamService }));
  api.use('/invitations', invitationRoutes({ auth, service: teamService }));
  api.use('/calc', calcRoutes({ db }));
  if (deps.outbox) api.use('/dev/outbox', outboxRoutes({ outbox: deps.outbox }));
  // Domain modules declare their own paths (/tanks, /lots, /housings, …) and guard each one.
  const moduleDeps: ModuleDeps = { db, storage: deps.storage, mailer, appUrl: config.appUrl };
  api.use(cellarRoutes(moduleDeps));
  api.use(equipmentRoutes(moduleDeps));
  api.use(cartridgesRoutes(moduleDeps));
  api.use(attachmentsRoutes(moduleDeps));
  api.use(winerySettingsRoutes(moduleDeps));
  api.use(todayRoutes(moduleDeps));
  api.use(plansRoutes(moduleDeps));
  api.use(careRoutes(moduleDeps));
  api.use(runsRoutes(moduleDeps));
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
