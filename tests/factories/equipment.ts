// Small helpers that create equipment over HTTP, for any test that needs a housing, a line
// or a cartridge type. Each call uses a fresh name; pass overrides for the fields you care about.
import type { CartridgeTypeDto, HousingDto, LineDto } from '../../shared/types/equipment';
import type { Client } from '../support/test-app';

let counter = 0;
const unique = (prefix: string) => {
  counter += 1;
  return `${prefix} ${Date.now().toString(36)}-${process.pid}-${counter}`;
};

export const housingInput = (overrides: Record<string, unknown> = {}) => ({
  name: unique('Housing'),
  rounds: 3,
  lengthIn: 30,
  maxPressureBar: 8,
  maxTempC: 140,
  holdUpL: 16,
  upstreamGasVolumeL: 12,
  notes: '',
  ...overrides,
});

export const lineInput = (overrides: Record<string, unknown> = {}) => ({
  name: unique('Line'),
  bottlesPerHour: 3000,
  bottleMl: 750,
  ...overrides,
});

export const cartridgeTypeInput = (overrides: Record<string, unknown> = {}) => ({
  name: unique('Type'),
  kind: 'membrane',
  media: 'PES',
  ratingUm: 0.45,
  areaM2Per10in: 0.7,
  waterFlowLhPer10in: 1200,
  waterDpBar: 0.1,
  maxDpForwardBar: 5,
  maxDpReverseBar: 2,
  maxTempC: 140,
  terminalDpBar: 1.5,
  designFluxLhPer10in: 400,
  ratedSteamCycles: 50,
  ratedHotWaterCycles: 100,
  ratedChemicalCycles: 30,
  flowRecoveryMinPct: 80,
  bubblePointMinBar: 3.2,
  diffusionMaxMlMinPer10in: 10,
  pricePer10in: 95,
  currency: 'EUR',
  ...overrides,
});

async function created<T>(res: { status: number; body: unknown; text: string }, what: string): Promise<T> {
  if (res.status !== 201) throw new Error(`creating a ${what} failed: ${res.status} ${res.text}`);
  return res.body as T;
}

/** Creates a housing (3 × 30-inch by default) as a person allowed to edit equipment. */
export async function createHousing(client: Client, overrides: Record<string, unknown> = {}): Promise<HousingDto> {
  return created(await client.post('/api/housings', housingInput(overrides)), 'housing');
}

/** Creates a bottling line (3,000 bottles/h of 750 mL by default). */
export async function createLine(client: Client, overrides: Record<string, unknown> = {}): Promise<LineDto> {
  return created(await client.post('/api/lines', lineInput(overrides)), 'line');
}

/** Creates a cartridge type (a 0.45 µm PES membrane by default). */
export async function createCartridgeType(client: Client, overrides: Record<string, unknown> = {}): Promise<CartridgeTypeDto> {
  return created(await client.post('/api/cartridge-types', cartridgeTypeInput(overrides)), 'cartridge type');
}
