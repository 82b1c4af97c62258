/**
 * The cartridges a bottling day needs, lot after lot, against the usable stock. Pure.
 *
 * Each lot's chosen train is sized on its own (see `sizeTrain`); over a day a set of
 * cartridges installed for one lot stays in its housing for the next lot when that lot runs
 * through the same train (same housings, types and counts, stage by stage) and the set still
 * has capacity: the next lot first uses what is left of the current load, then regenerates
 * the set (when it may) and only then installs a new set. Common practice, no source: the
 * left-over capacity is carried as the fraction of a load not yet used, so a set half-loaded
 * by one wine is half-loaded for the next wine too.
 */
import { requireNonNegative } from './errors';

/** One stage of a lot's chosen train, with its sizing for that lot. */
export interface DayNeedsStage {
  cartridgeTypeId: string;
  housingId: string;
  housingCount: number;
  lengthIn: number;
  /** Physical cartridges in one set. */
  cartridgeCount: number;
  /** 10-inch equivalents in one set. */
  elementEquivalents: number;
  /** Litres one load holds for this lot's wine (capacity to terminal ΔP), or null when unknown. */
  capacityL: number | null;
  /** Whether the set may be regenerated during the day. */
  regenerable: boolean;
  /** Most regenerations one set may take before it is changed (unlimited when absent). */
  maxRegenerationsPerLot?: number;
}

/** One lot of the day in bottling order; `stages` null when it has no usable chosen train. */
export interface DayNeedsLot {
  lotId: string;
  label: string;
  volumeL: number;
  stages: DayNeedsStage[] | null;
}

/** One cartridge the winery holds. */
export interface DayNeedsCartridge {
  cartridgeTypeId: string;
  lengthIn: number;
  status: 'in-stock' | 'installed' | 'regenerating' | 'retired';
  /** True when a rated budget (steam, hot-water or chemical cycles) is used up. */
  spent: boolean;
  /** Result of the latest integrity test: true passed, false failed, null none. */
  latestIntegrityPass: boolean | null;
}

/** What one stage does during one lot. */
export interface DayNeedsStageUse {
  /** True when the stage started the lot with the set left from the previous lot. */
  carriedOver: boolean;
  /** New sets installed for this lot (the first one before the lot when not carried over). */
  newSets: number;
  /** Regenerations during the lot, or null when capacity is unknown. */
  regenerations: number | null;
  /** Changes to a new set during the lot (not counting a set installed before it starts), or null when unknown. */
  changes: number | null;
  /** Each regeneration and change during the lot, after so many litres of it, in order (for the day's timeline). */
  stops: { kind: 'regeneration' | 'change'; afterL: number }[];
}

/** Cartridges of one type and length over the day. */
export interface DayNeedsLine {
  cartridgeTypeId: string;
  lengthIn: number;
  cartridgesNeeded: number;
  elementEquivalentsNeeded: number;
  /** Labels of the lots that install new sets of it. */
  lotLabels: string[];
  /** Usable cartridges in stock. */
  inStock: number;
  /** Usable cartridges installed. */
  installed: number;
  /** inStock + installed. */
  cartridgesAvailable: number;
  /** Cartridges of this type and length held, not retired, but not usable (spent, latest test failed, being regenerated). */
  notUsable: number;
  shortfall: number;
  verdict: 'enough' | 'short';
}

export interface DayNeeds {
  lines: DayNeedsLine[];
  /** Per lot (same order), what each stage does. */
  lots: { lotId: string; stages: DayNeedsStageUse[] | null }[];
}

/** Whether a cartridge counts as stock for the day: not retired, not spent, latest integrity test not failed, not being regenerated. */
export function cartridgeUsable(c: DayNeedsCartridge): boolean {
  return (c.status === 'in-stock' || c.status === 'installed') && !c.spent && c.latestIntegrityPass !== false;
}

/** A rated cycle budget used up makes a cartridge spent (a rating absent means no limit). */
export function cartridgeSpent(
  used: { steamCycles: number; hotWaterCycles: number; chemicalCycles: number },
  rated: { ratedSteamCycles: number | null; ratedHotWaterCycles: number | null; ratedChemicalCycles: number | null },
): boolean {
  const over = (u: number, r: number | null) => r !== null && u >= r;
  return over(used.steamCycles, rated.ratedSteamCycles) || over(used.hotWaterCycles, rated.ratedHotWaterCycles) || over(used.chemicalCycles, rated.ratedChemicalCycles);
}

const trainKey = (stages: DayNeedsStage[]) => stages.map((s) => `${s.housingId}|${s.cartridgeTypeId}|${String(s.housingCount)}`).join('>');

/**
 * The day's cartridge needs in lot order (see the module comment for the carry-over) against
 * the usable cartridges (see {@link cartridgeUsable}). A stage whose capacity is unknown needs
 * one new set for its lot and carries nothing over (the engine does not know what is left).
 *
 * @throws RangeError for a negative volume or capacity
 */
export function dayCartridgeNeeds(lots: readonly DayNeedsLot[], cartridges: readonly DayNeedsCartridge[]): DayNeeds {
  type State = { fractionLeft: number; loadsOnSet: number } | null;
  let prevKey: string | null = null;
  let states: State[] = [];
  const acc = new Map<string, { typeId: string; lengthIn: number; cartridges: number; eq: number; labels: string[] }>();
  const perLot: DayNeeds['lots'] = [];

  for (const lot of lots) {
    requireNonNegative(`${lot.label} volume`, lot.volumeL);
    if (!lot.stages || lot.stages.length === 0) {
      perLot.push({ lotId: lot.lotId, stages: null });
      prevKey = null;
      states = [];
      continue;
    }
    const key = trainKey(lot.stages);
    const same = key === prevKey;
    const uses: DayNeedsStageUse[] = [];
    const next: State[] = [];
    lot.stages.forEach((s, i) => {
      const prev = same ? states[i] : null;
      let newSets: number;
      let use: DayNeedsStageUse;
      if (s.capacityL === null || !(s.capacityL > 0)) {
        if (s.capacityL !== null) requireNonNegative(`${lot.label} capacity`, s.capacityL);
        newSets = 1;
        use = { carriedOver: false, newSets, regenerations: null, changes: null, stops: [] };
        next.push(null);
      } else {
        const cap = s.capacityL;
        const perSet = s.regenerable ? 1 + (s.maxRegenerationsPerLot ?? Infinity) : 1;
        const carriedL = prev ? prev.fractionLeft * cap : 0;
        if (prev && lot.volumeL <= carriedL + 1e-9 * cap) {
          newSets = 0;
          use = { carriedOver: true, newSets, regenerations: 0, changes: 0, stops: [] };
          next.push({ fractionLeft: Math.max(0, prev.fractionLeft - lot.volumeL / cap), loadsOnSet: prev.loadsOnSet });
        } else {
          const rest = lot.volumeL - carriedL;
          const loads = Math.max(1, Math.ceil(rest / cap - 1e-9));
          const onCurrent = prev ? Math.min(loads, perSet - prev.loadsOnSet) : 0;
          const restLoads = loads - onCurrent;
          newSets = perSet === Infinity ? (restLoads > 0 ? 1 : 0) : Math.ceil(restLoads / perSet);
          const loadsOnSet = restLoads > 0 ? (perSet === Infinity ? restLoads : restLoads - (newSets - 1) * perSet) : (prev?.loadsOnSet ?? 0) + loads;
          const changes = prev ? newSets : newSets - 1;
          // Load j starts after carriedL + j × capacity litres; the first load of a lot not carried
          // over is the set installed before it. Loads on the carried set are regenerations; then
          // each new set's first load is a change and its others regenerations.
          const stops: DayNeedsStageUse['stops'] = [];
          for (let j = prev ? 0 : 1; j < loads; j++) {
            const k = j - onCurrent;
            const kind = j < onCurrent ? 'regeneration' : perSet === Infinity ? (k === 0 ? 'change' : 'regeneration') : k % perSet === 0 ? 'change' : 'regeneration';
            stops.push({ kind, afterL: carriedL + j * cap });
          }
          use = { carriedOver: Boolean(prev), newSets, regenerations: loads - newSets, changes, stops };
          next.push({ fractionLeft: Math.max(0, (loads * cap - rest) / cap), loadsOnSet });
        }
      }
      uses.push(use);
      if (newSets > 0) {
        const k = `${s.cartridgeTypeId}|${String(s.lengthIn)}`;
        const a = acc.get(k) ?? { typeId: s.cartridgeTypeId, lengthIn: s.lengthIn, cartridges: 0, eq: 0, labels: [] };
        a.cartridges += newSets * s.cartridgeCount;
        a.eq += newSets * s.elementEquivalents;
        if (!a.labels.includes(lot.label)) a.labels.push(lot.label);
        acc.set(k, a);
      }
    });
    perLot.push({ lotId: lot.lotId, stages: uses });
    prevKey = key;
    states = next;
  }

  const lines: DayNeedsLine[] = [...acc.values()].map((a) => {
    const held = cartridges.filter((c) => c.cartridgeTypeId === a.typeId && c.lengthIn === a.lengthIn);
    const usable = held.filter(cartridgeUsable);
    const inStock = usable.filter((c) => c.status === 'in-stock').length;
    const installed = usable.length - inStock;
    const shortfall = Math.max(0, a.cartridges - usable.length);
    return {
      cartridgeTypeId: a.typeId,
      lengthIn: a.lengthIn,
      cartridgesNeeded: a.cartridges,
      elementEquivalentsNeeded: a.eq,
      lotLabels: a.labels,
      inStock,
      installed,
      cartridgesAvailable: usable.length,
      notUsable: held.filter((c) => c.status !== 'retired').length - usable.length,
      shortfall,
      verdict: shortfall > 0 ? 'short' : 'enough',
    };
  });
  return { lines, lots: perLot };
}
