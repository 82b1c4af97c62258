// Closed runs with known outcomes, made through the API, for capacity learned from past runs:
// each stage's ΔP climbs from clean to its terminal ΔP at the litres asked for.
import { randomUUID } from 'node:crypto';
import type { Client } from '../support/test-app';
import { createLabResult, createLot } from './cellar';
import { sanitiseAndTest, startRunOf, type BottledWorld } from './records';

async function ok<T = unknown>(res: { status: number; body: unknown; text: string }, status: number, what: string): Promise<T> {
  if (res.status !== status) throw new Error(`${what} failed: ${res.status} ${res.text}`);
  return res.body as T;
}

/**
 * A lot of `style` with a lab result (t200/t400 for its clogging index), bottled through the
 * world's two-stage train in a closed run in which stage k reached `terminalDpBar` at
 * `reachL[k]` litres (readings at 500 L, half-way and at the end). Answers the run and lot ids.
 */
export async function createClosedRunReaching(
  owner: Client,
  w: BottledWorld,
  opts: { style: string; reachL: [number, number]; t200s?: number; t400s?: number; turbidityNtu?: number; terminalDpBar?: number; volumeL?: number },
) {
  const lot = await createLot(owner, { style: opts.style, volumeL: opts.volumeL ?? 8000, name: `Past ${opts.style}` });
  await createLabResult(owner, lot.id, {
    sampledAt: new Date(Date.now() - 86_400_000).toISOString(),
    turbidityNtu: opts.turbidityNtu ?? 0.6,
    t200s: opts.t200s ?? 28,
    t400s: opts.t400s ?? 66,
  });
  await sanitiseAndTest(owner, w);
  const { runId } = await startRunOf(owner, w, lot.id, opts.volumeL ?? 8000);
  const terminal = opts.terminalDpBar ?? 1.5;
  for (const [stageIndex, reach] of opts.reachL.entries()) {
    const points: [number, number][] = [
      [500, 0.2],
      [reach / 2, 0.2 + (terminal - 0.2) * 0.4],
      [reach, terminal],
    ];
    for (const [volumeL, dp] of points) {
      await ok(
        await owner.post(`/api/runs/${runId}/readings`, { clientKey: randomUUID(), stageIndex, volumeL, upstreamBar: 2 + dp, downstreamBar: 2, flowLh: 2500, tempC: 12 }),
        201,
        'logging a reading',
      );
    }
  }
  await ok(await owner.post(`/api/runs/${runId}/close`, { notes: 'Past run for capacity.' }), 200, 'closing the run');
  return { runId, lotId: lot.id };
}

/**
 * Corrects the volume of a closed run's reading on `stageIndex` logged at `fromL` to `toL`
 * (pressures kept; flow and temperature when given), through the API: 201 or it throws.
 */
export async function correctReadingVolume(owner: Client, runId: string, stageIndex: number, fromL: number, toL: number, extra: { flowLh?: number; tempC?: number } = {}) {
  const run = (await owner.get(`/api/runs/${runId}`)).body as { stages: { readings: { id: string; volumeL: number; upstreamBar: number; downstreamBar: number }[] }[] };
  const reading = run.stages[stageIndex].readings.find((r) => r.volumeL === fromL);
  if (!reading) throw new Error(`no reading at ${String(fromL)} L on stage ${String(stageIndex)}`);
  await ok(
    await owner.post(`/api/runs/${runId}/readings/${reading.id}/correct`, {
      volumeL: toL,
      upstreamBar: reading.upstreamBar,
      downstreamBar: reading.downstreamBar,
      ...extra,
      reason: 'Meter read from the wrong tank.',
    }),
    201,
    'correcting a reading',
  );
}
