/**
 * Benchmark cases for the blocking-law fitters. Data are fictional and deterministic:
 * a 10 000-reading logger file of a run at constant flow (standard blocking, ΔP0 =
 * 0.15 bar rising to 0.6 bar over 12 000 L, 1 % multiplicative noise) and a 200-reading
 * constant-pressure disc test (standard blocking, J0 = 20 L m⁻² min⁻¹, k_s = 0.01 m²/L,
 * 0.3 % noise).
 */
import { blockingVolume, fitConstantFlow, fitConstantPressure } from '../../shared/engine';
import { seededNormals } from '../../tests/support/seeded-random';


const N_FLOW = 10_000;
const V_END = 12_000; // L
const K_STD = (1 - 1 / Math.sqrt(4)) / V_END; // ΔP quadruples by the end
const zf = seededNormals(20240611);
export const flowReadings = Array.from({ length: N_FLOW }, (_, i) => {
  const V = (V_END * i) / (N_FLOW - 1);
  return { volumeL: V, dpBar: (0.15 / (1 - K_STD * V) ** 2) * (1 + 0.01 * zf()) };
});

const AREA = 3.5e-4; // m², fictional disc
const zp = seededNormals(7);
const discReadings = Array.from({ length: 200 }, (_, i) => {
  const tMin = 0.3 * (i + 1); // every 18 s for 60 min
  const v = blockingVolume('standard', { k: 0.01, j0: 20, t: tMin }) * (1 + 0.003 * zp());
  return { timeS: tMin * 60, volumeMl: v * AREA * 1000 };
});

export const cases = [
  {
    name: 'fitConstantFlow, 10 000 readings, all four laws',
    run: () => fitConstantFlow(flowReadings),
    warmup: 200,
    iterations: 500,
  },
  {
    name: 'fitConstantPressure, 200 readings (Vmax line + four laws)',
    run: () => fitConstantPressure({ points: discReadings, discAreaM2: AREA }),
    warmup: 200,
    iterations: 500,
  },
];

/** External comparisons run by scripts/bench.ts: same data through another implementation. */
export const external = [
  {
    name: 'scipy.optimize.curve_fit, same 10 000 readings, all four laws',
    compareTo: cases[0].name,
    command: ['python3', 'scripts/bench/scipy_fit.py'],
    input: () => ({
      volumeL: flowReadings.map((p) => p.volumeL),
      dpBar: flowReadings.map((p) => p.dpBar),
      repeats: 30,
    }),
    /** Our constants for the same data, to print the agreement. */
    reference: () =>
      Object.fromEntries(fitConstantFlow(flowReadings).map((f) => [f.law, { dp0Bar: f.dp0Bar, kPerL: f.kPerL, rss: f.rss }])),
  },
];
