import express, { Router } from 'express';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeBySegment } from './route-by-segment';

// Two routers sharing the `runs` segment (as the runs and logger modules do), one of them
// declining a path with next('router'), and an error passed on: the answers are Express's own.
let base = '';
let close = () => {};
beforeAll(async () => {
  const runs = Router();
  runs.get('/runs', (_req, res) => void res.json({ from: 'runs' }));
  runs.get('/runs/:id/skip', (_req, _res, next) => next('router'));
  runs.get('/runs/:id/fail', () => {
    throw new Error('boom');
  });
  const logger = Router();
  logger.get('/runs/:id/skip', (req, res) => void res.json({ from: 'logger', id: req.params.id }));
  const plans = Router();
  plans.get('/plans/:id', (req, res) => void res.json({ from: 'plans', id: req.params.id }));
  const api = Router();
  api.use(routeBySegment([runs, logger, plans]));
  api.use((_req, res) => void res.status(404).json({ from: 'not found' }));
  const app = express();
  app.use('/api', api);
  app.use((err: Error, _req: express.Request, res: express.Response, _next: express.NextFunction) => void res.status(500).json({ error: err.message }));
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${String((server.address() as AddressInfo).port)}`;
  close = () => server.close();
});
afterAll(() => close());

const get = async (path: string) => {
  const res = await fetch(base + path);
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
};

describe('routeBySegment', () => {
  it('hands a request to the routers of its first segment, in order, as Express would', async () => {
    expect(await get('/api/runs')).toEqual({ status: 200, body: { from: 'runs' } });
    expect(await get('/api/RUNS')).toEqual({ status: 200, body: { from: 'runs' } }); // Express ignores case
    expect(await get('/api/runs/')).toEqual({ status: 200, body: { from: 'runs' } }); // and a trailing slash
    expect(await get('/api/runs/7/skip')).toEqual({ status: 200, body: { from: 'logger', id: '7' } });
    expect(await get('/api/plans/9')).toEqual({ status: 200, body: { from: 'plans', id: '9' } });
  });

  it('passes errors on, and what no router holds falls through to the next handler', async () => {
    expect(await get('/api/runs/7/fail')).toEqual({ status: 500, body: { error: 'boom' } });
    expect((await get('/api/lots')).body).toEqual({ from: 'not found' });
    expect((await get('/api/plans')).body).toEqual({ from: 'not found' });
  });

  it('refuses, at start-up, a router whose route does not start with a fixed segment', () => {
    const odd = Router();
    odd.get('/:anything', (_req, res) => void res.end());
    expect(() => routeBySegment([odd])).toThrow(/fixed path segment/);
    const mw = Router();
    mw.use((_req, _res, next) => next());
    expect(() => routeBySegment([mw])).toThrow(/fixed path segment/);
  });
});
