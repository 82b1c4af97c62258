// Engine inputs the calculation tests share (fictional figures, no source).
import type { PastRunsCapacity, TrainSizingInput } from '../../shared/engine';

/** A 10,000 L white at 20 °C through a 1 µm prefilter (3 × 20 in) and a 0.45 µm membrane (3 × 30 in), no capacity source given. */
export function twoStageSizingInput(): TrainSizingInput {
  return {
    wine: { tempC: 20, ethanolPctVol: 12 },
    line: { bottlesPerHour: 3000, bottleMl: 750, marginPct: 10 },
    batchL: 10_000,
    stages: [
      {
        name: 'Prefilter 1 µm',
        cartridgeType: { kind: 'prefilter', ratingUm: 1, areaM2Per10in: 0.6, waterFlowLhPer10in: 1000, waterDpBar: 0.05, maxDpForwardBar: 5, terminalDpBar: 2, designFluxLhPer10in: 1200 },
        housing: { rounds: 3, lengthIn: 20, maxPressureBar: 6, holdUpL: 10 },
      },
      {
        name: 'Membrane 0.45 µm',
        cartridgeType: { kind: 'membrane', ratingUm: 0.45, areaM2Per10in: 0.6, waterFlowLhPer10in: 500, waterDpBar: 0.1, maxDpForwardBar: 5, terminalDpBar: 1.2, designFluxLhPer10in: 500 },
        housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, holdUpL: 20 },
      },
    ],
  };
}

/** Three past runs of whites, nearest by clogging index: 1,500 L/m² (1,350–1,720). */
export const pastRunsOfWhites: PastRunsCapacity = { lPerM2: 1500, lowLPerM2: 1350, highLPerM2: 1720, runs: 3, style: 'white', nearestBy: 'clogging-index', runIds: ['a', 'b', 'c'] };
