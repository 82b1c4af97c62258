// Valid request bodies for the cellar, with unique codes and names per call.
import type { Client } from '../support/test-app';

let n = 0;
const unique = () => `${Date.now().toString(36)}${process.pid.toString(36)}${(n += 1)}`.toUpperCase();

export const tankBody = (over: Record<string, unknown> = {}) => ({ name: `Tank ${unique()}`, capacityL: 10_000, notes: '', ...over });

export const lotBody = (over: Record<string, unknown> = {}) => ({
  code: `L-${unique()}`,
  name: 'Test lot',
  style: 'white',
  vintage: 2024,
  volumeL: 5_000,
  tankId: null,
  ethanolPctVol: 12.5,
  sugarGPerL: 2,
  tempC: 12,
  notes: '',
  ...over,
});

export const labResultBody = (over: Record<string, unknown> = {}) => ({
  sampledAt: '2025-03-10T09:30:00.000Z',
  turbidityNtu: 0.6,
  t200s: 28,
  t400s: 66,
  freeSo2MgL: 28,
  notes: '',
  ...over,
});

/** Constant-pressure disc test points that follow standard blocking (Q0 mL/s, Vmax mL). */
export const discPoints = (q0 = 2.4, vmaxMl = 5000, minutes = 10) =>
  Array.from({ length: minutes }, (_, i) => {
    const t = (i + 1) * 60;
    return { timeS: t, volumeMl: Math.round((q0 * t) / (1 + (q0 * t) / vmaxMl)) };
  });

export async function createTank(client: Client, over: Record<string, unknown> = {}) {
  const res = await client.post('/api/tanks', tankBody(over));
  if (res.status !== 201) throw new Error(`tank create failed: ${res.status} ${res.text}`);
  return res.body as { id: string; name: string };
}

export async function createLot(client: Client, over: Record<string, unknown> = {}) {
  const res = await client.post('/api/lots', lotBody(over));
  if (res.status !== 201) throw new Error(`lot create failed: ${res.status} ${res.text}`);
  return res.body as { id: string; code: string };
}

export async function createLabResult(client: Client, lotId: string, over: Record<string, unknown> = {}) {
  const res = await client.post(`/api/lots/${lotId}/lab-results`, labResultBody(over));
  if (res.status !== 201) throw new Error(`lab result create failed: ${res.status} ${res.text}`);
  return res.body as { id: string };
}
