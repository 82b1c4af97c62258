/**
 * Benchmark cases for train sizing: the plan screen recomputes a sizing on every
 * keystroke, so one four-stage sizing must stay well under 0.2 ms.
 */
import { sizeTrain, type TrainSizingInput } from '../../shared/engine';

/** A four-stage train (two prefilters, a 0.65 µm and a 0.45 µm membrane) on a 3,000 bottles/h line; fictional data. */
const fourStageTrain: TrainSizingInput = {
  wine: { tempC: 14, ethanolPctVol: 12.5, sugarGPerL: 4, extractFactor: 1.03 },
  line: { bottlesPerHour: 3000, bottleMl: 750, marginPct: 10 },
  batchL: 12_000,
  lineLosses: {
    hoses: [
      { diameterMm: 38, lengthM: 15, sumK: 2.5 },
      { diameterMm: 38, lengthM: 8, roughnessMm: 0.005, sumK: 1.2 },
    ],
    staticHeadBar: 0.15,
    fillerInletBar: 0.3,
  },
  stages: [
    {
      name: 'PP 5 µm',
      cartridgeType: {
        kind: 'prefilter', ratingUm: 5, areaM2Per10in: 0.6, waterFlowLhPer10in: 1500, waterDpBar: 0.05,
        maxDpForwardBar: 5, terminalDpBar: 2, designFluxLhPer10in: 1800, capacityLPerM2: 12_000,
        regenerable: true, pricePer10in: 30, currency: 'EUR',
      },
      housing: { rounds: 1, lengthIn: 30, maxPressureBar: 6, holdUpL: 4 },
    },
    {
      name: 'PP/GF 1 µm',
      cartridgeType: {
        kind: 'prefilter', ratingUm: 1, areaM2Per10in: 0.55, waterFlowLhPer10in: 900, waterDpBar: 0.08,
        maxDpForwardBar: 5, terminalDpBar: 1.8, designFluxLhPer10in: 1000, capacityLPerM2: 6000,
        regenerable: true, maxRegenerationsPerLot: 2, pricePer10in: 70, currency: 'EUR',
      },
      housing: { rounds: 3, lengthIn: 20, maxPressureBar: 6, holdUpL: 12 },
    },
    {
      name: 'PES 0.65 µm',
      cartridgeType: {
        kind: 'membrane', ratingUm: 0.65, areaM2Per10in: 0.65, waterFlowLhPer10in: 800, waterDpBar: 0.1,
        maxDpForwardBar: 5, maxTempC: 80, terminalDpBar: 1.2, designFluxLhPer10in: 700, capacityLPerM2: 3000,
        regenerable: true, pricePer10in: 150, currency: 'EUR',
      },
      housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, maxTempC: 90, holdUpL: 20 },
    },
    {
      name: 'PES 0.45 µm',
      cartridgeType: {
        kind: 'membrane', ratingUm: 0.45, areaM2Per10in: 0.6, waterFlowLhPer10in: 500, waterDpBar: 0.1,
        maxDpForwardBar: 5, maxTempC: 80, terminalDpBar: 1.2, designFluxLhPer10in: 500, capacityLPerM2: 2000,
        regenerable: true, maxRegenerationsPerLot: 3, pricePer10in: 180, currency: 'EUR',
      },
      housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, maxTempC: 90, holdUpL: 20 },
    },
  ],
};

/** The same train with the wine 0.5 °C warmer, so that alternate calls miss the engine's one-entry memo of the wine's properties (the worst case: a temperature edit on every keystroke). */
const fourStageTrainWarmer: TrainSizingInput = { ...fourStageTrain, wine: { ...fourStageTrain.wine, tempC: 14.5 } };
let flip = false;

/** Benchmark cases run by the bench runner. */
export const cases: { name: string; run: () => unknown; warmup?: number; iterations?: number }[] = [
  {
    name: 'sizeTrain: four stages with hose losses, wine edited on every call',
    run: () => {
      flip = !flip;
      return sizeTrain(flip ? fourStageTrain : fourStageTrainWarmer);
    },
    warmup: 500,
    iterations: 10_000,
  },
];
