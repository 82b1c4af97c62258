import type { CartridgeLife } from '../engine';
import type { CycleKind, IntegrityTestKind } from '../schemas/care';

/** One logged care cycle or integrity test, with the cartridge it belongs to. */
export type CareEventDto = {
  id: string;
  kind: 'cycle' | 'integrity';
  at: string;
  cartridgeId: string;
  serial: string;
  typeName: string;
  /** Who logged it (name), or null when the account is gone. */
  actorName: string | null;
  housingName: string | null;
  /** The stored details: for cycles { kind, tempC, durationMin, agent, concentrationPct, waterFlowBeforeLh, waterFlowAfterLh }; for tests { pass, test, reason, measured…, limit… }. */
  details: Record<string, unknown>;
};

/** What a care form needs to know about one cartridge: its limits and its water-flow basis. */
export type CareTargetDto = {
  id: string;
  serial: string;
  batch: string;
  typeName: string;
  typeKind: string;
  status: string;
  lengthIn: number;
  elementEquivalents: number;
  /** 10-inch equivalents of every cartridge installed in its housing (a diffusion or pressure-hold test covers them all); null when not installed */
  housingElementEquivalents: number | null;
  housingId: string | null;
  housingName: string | null;
  /** Gas volume upstream of the membrane in the housing, L (null when not installed or not entered). */
  upstreamGasVolumeL: number | null;
  maxTempC: number;
  bubblePointMinBar: number | null;
  diffusionMaxMlMinPer10in: number | null;
  flowRecoveryMinPct: number;
  /** The type's clean-water specification ΔP, bar: the reference flows are brought to, and the default ΔP of a flow measurement. */
  waterDpBar: number;
  /** Clean-water flow to compare against: the as-new flow, else the first flow logged after a cycle. */
  flowBasis: { kind: 'new' | 'spec' | 'first-after'; flowLh: number } | null;
  steamCycles: number;
  hotWaterCycles: number;
  chemicalCycles: number;
};

export type CycleResultDto = {
  event: CareEventDto;
  steamCycles: number;
  hotWaterCycles: number;
  chemicalCycles: number;
  /** The engine's updated life forecast (planning estimate), or null with lifeError. */
  life: CartridgeLife | null;
  lifeError: string | null;
};

export type IntegrityResultDto = {
  event: CareEventDto;
  test: IntegrityTestKind;
  pass: boolean;
  /** true when a product-wet fail is not final: re-flush with water and re-test */
  retest: boolean;
  reason: string;
  life: CartridgeLife | null;
  lifeError: string | null;
};

export type CareRecentDto = { items: CareEventDto[] };
export type { CycleKind, IntegrityTestKind };
