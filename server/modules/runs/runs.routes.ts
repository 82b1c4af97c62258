import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import {
  closeRunInputSchema,
  correctReadingInputSchema,
  logReadingInputSchema,
  logReadingsBatchInputSchema,
  runReadingsQuerySchema,
  runChangeInputSchema,
  startRunInputSchema,
  voidReadingInputSchema,
} from '../../../shared/schemas/runs';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { withBody, withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createRunsService } from './runs.service';

/**
 * Runs of approved plans' lots, followed by pressure readings per stage. Everyone reads
 * ('runs:read'); owners, cellar masters, winemakers and technicians start runs, log
 * readings and close runs ('runs:log').
 */
export function runsRoutes({ db, answers }: ModuleDeps) {
  const router = Router();
  const service = createRunsService(db);
  const read = [requireSignedIn, authorize(db, 'runs:read')];
  const log = [requireSignedIn, authorize(db, 'runs:log')];

  router.get('/runs', ...read, answers.reuse, async (_req, res) => {
    res.json(await service.list(tenantOf(res)));
  });
  router.get('/runs/start-options', ...read, async (_req, res) => {
    res.json(await service.startOptions(tenantOf(res)));
  });
  router.get('/runs/start-check', ...read, withQuery(z.object({ planLotId: uuidSchema }), async (_req, res, query) => {
    res.json(await service.startCheck(tenantOf(res), query.planLotId));
  }));
  // "Plan with what is installed": changes an approved plan's train, so it needs the approver's role.
  router.post(
    '/runs/plan-with-installed',
    requireSignedIn,
    authorize(db, 'plans:approve'),
    withBody(z.object({ planLotId: uuidSchema, stageIndex: z.number().int().min(0).max(20) }), async (_req, res, body) => {
      res.json(await service.planWithInstalled(tenantOf(res), body.planLotId, body.stageIndex));
    }),
  );
  router.post('/runs', ...log, idempotent(db), withBody(startRunInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.start(tenantOf(res), body));
  }));
  router.get('/runs/:id', ...read, answers.reuse, async (req, res) => {
    res.json(await service.detail(tenantOf(res), idParam(req, 'id', 'Run')));
  });
  // The run's stored readings, newest first, a page at a time (the run detail carries only the chart's points).
  router.get('/runs/:id/readings', ...read, answers.reuse, withQuery(runReadingsQuerySchema, async (req, res, query) => {
    res.json(await service.readings(tenantOf(res), idParam(req, 'id', 'Run'), query));
  }));
  // Idempotent by the reading's clientKey: a resent reading answers the stored one.
  // `?with=stage` adds the stage's new figures, so the phone need not reload the run.
  router.post('/runs/:id/readings', ...log, withBody(logReadingInputSchema, async (req, res, body) => {
    const withStage = req.query.with === 'stage';
    res.status(201).json(await service.logReading(tenantOf(res), idParam(req, 'id', 'Run'), body, { withStage }));
  }));
  // Up to 1,000 readings, idempotent per clientKey, all checked before any is stored.
  router.post('/runs/:id/readings/batch', ...log, withBody(logReadingsBatchInputSchema, async (req, res, body) => {
    res.json(await service.logReadingsBatch(tenantOf(res), idParam(req, 'id', 'Run'), body));
  }));
  router.post('/runs/:id/changes', ...log, idempotent(db), withBody(runChangeInputSchema, async (req, res, body) => {
    res.status(201).json(await service.change(tenantOf(res), idParam(req, 'id', 'Run'), body));
  }));
  router.post('/runs/:id/readings/:readingId/correct', ...log, idempotent(db), withBody(correctReadingInputSchema, async (req, res, body) => {
    res.status(201).json(await service.correctReading(tenantOf(res), idParam(req, 'id', 'Run'), idParam(req, 'readingId', 'Reading'), body));
  }));
  router.post('/runs/:id/readings/:readingId/void', ...log, idempotent(db), withBody(voidReadingInputSchema, async (req, res, body) => {
    res.status(201).json(await service.voidReading(tenantOf(res), idParam(req, 'id', 'Run'), idParam(req, 'readingId', 'Reading'), body));
  }));
  router.post('/runs/:id/close', ...log, withBody(closeRunInputSchema, async (req, res, body) => {
    res.json(await service.close(tenantOf(res), idParam(req, 'id', 'Run'), body));
  }));

  return router;
}
