/**
 * Benchmark case for the cartridge life forecast: the Cartridges and Care screens
 * recompute the forecast of every cartridge in a list, so one forecast over a long
 * history (200 care cycles) must stay fast.
 */
import { cartridgeLife, type CareCycle, type CareCycleKind, type CartridgeHistory, type CartridgeRatings } from '../../shared/engine';

/** A 30" PES membrane type; fictional ratings. */
const ratings: CartridgeRatings = {
  ratedSteamCycles: 100,
  ratedHotWaterCycles: 150,
  ratedChemicalCycles: 80,
  ratedLitres: 3_000_000,
  ratedSteamMinutes: 3000,
  flowRecoveryMinPct: 60,
};

const pattern: CareCycleKind[] = ['hot-water', 'backflush', 'steam', 'chemical', 'hot-water'];

/** 200 care cycles with a slowly falling flow recovery and a little scatter; fictional history. */
const cycles: CareCycle[] = Array.from({ length: 200 }, (_, i) => {
  const kind = pattern[i % pattern.length];
  const scatter = ((i * 37) % 11) - 5; // deterministic ±5 L/h
  return {
    kind,
    seq: i + 1,
    atMs: 1_700_000_000_000 + i * 2 * 86_400_000,
    tempC: kind === 'steam' ? 121 : kind === 'hot-water' ? 85 : 40,
    durationMin: kind === 'steam' ? 30 : 20,
    ...(kind === 'chemical' ? { agent: 'NaOH 1 %' } : {}),
    ...(kind !== 'steam' ? { waterFlowBeforeLh: 900 - i, waterFlowAfterLh: 2400 - 2.5 * i + scatter } : {}),
  };
});

const history: CartridgeHistory = {
  litresFiltered: 1_200_000,
  waterFlowNewLh: 2500,
  cycles,
  integrity: Array.from({ length: 60 }, (_, i) => ({ pass: true, atMs: 1_700_000_000_000 + i * 7 * 86_400_000 })),
};

export const cases: { name: string; run: () => unknown; warmup?: number; iterations?: number }[] = [
  {
    name: 'cartridge life forecast, 200 cycles',
    run: () => cartridgeLife(ratings, history, { cyclesPerWeek: 3.5, nowMs: 1_735_000_000_000 }),
    warmup: 200,
    iterations: 2000,
  },
];
