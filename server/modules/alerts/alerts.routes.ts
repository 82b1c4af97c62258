import { Router } from 'express';
import { alertPreferencesInputSchema, notificationsQuerySchema } from '../../../shared/schemas/alerts';
import { idParam } from '../../lib/params';
import { authOf, requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { withBody, withQuery } from '../../middleware/validate';
import type { AlertsService } from './alerts.service';
import type { createCalendarService } from './calendar.service';

type Deps = { db: import('../../db/client').Database; service: AlertsService; calendar: ReturnType<typeof createCalendarService> };

/**
 * Alerts as they reach each person (everyone reads their own), their preferences, the mail that
 * could not be delivered (owners), and calendars: a plan's day as .ics and the person's private feed.
 */
export function alertsRoutes({ db, service, calendar }: Deps) {
  const router = Router();
  const own = [requireSignedIn, authorize(db, 'notifications:read')];
  const owner = [requireSignedIn, authorize(db, 'mail-failures:manage')];

  router.get('/notifications', ...own, withQuery(notificationsQuerySchema, async (_req, res, query) => {
    res.json(await service.notifications(tenantOf(res), query));
  }));
  router.post('/notifications/read-all', ...own, async (_req, res) => {
    res.json(await service.markAllRead(tenantOf(res)));
  });
  router.post('/notifications/:id/read', ...own, async (req, res) => {
    await service.markRead(tenantOf(res), idParam(req, 'id', 'Notification'));
    res.status(204).end();
  });
  router.get('/me/alert-preferences', ...own, async (_req, res) => {
    res.json(await service.preferences(tenantOf(res)));
  });
  router.put('/me/alert-preferences', ...own, withBody(alertPreferencesInputSchema, async (_req, res, body) => {
    res.json(await service.setPreferences(tenantOf(res), body));
  }));
  // PATCH changes only the kinds sent; the others keep their channel (PUT replaces the whole set).
  router.patch('/me/alert-preferences', ...own, withBody(alertPreferencesInputSchema, async (_req, res, body) => {
    const sent = new Map(body.items.map((i) => [i.kind, i.channel]));
    const current = await service.preferences(tenantOf(res));
    const items = current.items.map((i) => ({ kind: i.kind, channel: sent.get(i.kind) ?? i.channel }));
    res.json(await service.setPreferences(tenantOf(res), { items }));
  }));
  router.get('/settings/mail-failures', ...owner, async (_req, res) => {
    res.json(await service.mailFailures(tenantOf(res)));
  });
  router.post('/settings/mail-failures/:id/resend', ...owner, async (req, res) => {
    await service.resendMail(tenantOf(res), idParam(req, 'id', 'Mail'));
    res.status(202).json({ queued: true });
  });

  router.get('/plans/:id/calendar', requireSignedIn, authorize(db, 'plans:read'), async (req, res) => {
    const { ics, fileName } = await calendar.planCalendar(tenantOf(res), idParam(req, 'id', 'Plan'));
    res.set('Content-Type', 'text/calendar; charset=utf-8').set('Content-Disposition', `attachment; filename="${fileName}"`).send(ics);
  });
  router.post('/me/calendar-feed', requireSignedIn, async (_req, res) => {
    res.status(201).json(await calendar.rotateFeed(authOf(res).user.id));
  });
  // The feed is read by calendar programs without a session: the secret in the URL is the key.
  router.get('/calendar/:token', async (req, res) => {
    const ics = await calendar.feed(String(req.params.token ?? ''));
    if (ics === null) {
      res.status(404).json({ error: { code: 'not_found', message: 'This calendar link is not valid (it may have been replaced).' } });
      return;
    }
    res.set('Content-Type', 'text/calendar; charset=utf-8').send(ics);
  });
  return router;
}
