import { describe, expect, it } from 'vitest';
import type { CareTargetDto } from '@shared/types/care';
import { integrityPreview, recoveryPreview } from './care-preview';

const target = (over: Partial<CareTargetDto> = {}): CareTargetDto => ({
  id: 'c1',
  serial: 'PW-0001',
  batch: 'B1',
  typeName: 'PES 0.45',
  typeKind: 'membrane',
  status: 'installed',
  lengthIn: 30,
  elementEquivalents: 3,
  housingElementEquivalents: 9,
  housingId: 'h1',
  housingName: 'Three-round housing',
  upstreamGasVolumeL: 27,
  maxTempC: 80,
  bubblePointMinBar: 2.5,
  diffusionMaxMlMinPer10in: 12,
  flowRecoveryMinPct: 70,
  waterDpBar: 0.1,
  flowBasis: null,
  steamCycles: 0,
  hotWaterCycles: 0,
  chemicalCycles: 0,
  ...over,
});

describe('integrity preview in the browser (PDA Technical Report No. 26; Young–Laplace)', () => {
  it('3 × 30-inch housing, 12 mL/min per 10-inch, 27 L, 10 min: 33.8 mbar would pass against 40.5 mbar', () => {
    const p = integrityPreview(target(), 'pressure-hold', { decayMbar: 33.8, testMin: 10 }, 'metric');
    expect(p && 'verdict' in p ? p.verdict : null).toMatchObject({ pass: true });
    expect(p && 'verdict' in p ? p.verdict.reason : '').toMatch(/maximum 40\.5 mbar/);
  });

  it('a cartridge on the shelf is judged alone for diffusion', () => {
    const p = integrityPreview(target({ status: 'in-stock', housingId: null, housingElementEquivalents: null }), 'diffusion', { diffusionMlMin: 40 }, 'metric');
    expect(p && 'verdict' in p ? p.verdict : null).toMatchObject({ pass: false }); // 40 > 3 × 12 = 36
  });

  it('wine-wet at 12 % vol: 1.8 bar passes against ≈ 1.70 bar; 1.4 bar asks for a water re-test', () => {
    const ok = integrityPreview(target(), 'bubble-point', { bubblePointBar: 1.8, wettingFluid: 'wine', ethanolPctVol: 12, tempC: 20 }, 'metric');
    expect(ok && 'verdict' in ok ? ok.verdict.pass : null).toBe(true);
    const low = integrityPreview(target(), 'bubble-point', { bubblePointBar: 1.4, wettingFluid: 'wine', ethanolPctVol: 12 }, 'metric');
    expect(low && 'verdict' in low ? low.verdict : null).toMatchObject({ pass: false, retest: true });
    const noStrength = integrityPreview(target(), 'bubble-point', { bubblePointBar: 1.4, wettingFluid: 'wine' }, 'metric');
    expect(noStrength && 'missing' in noStrength ? noStrength.missing : '').toMatch(/strength/);
  });
});

// Darcy's law for laminar flow through a porous medium: at one temperature Q ∝ ΔP, so 1,800 L/h
// measured at 0.05 bar is 3,600 L/h at the 0.1 bar the type's clean-water flow is given at.
describe('recovery preview at the ΔP of the measurement (Darcy: flow ∝ ΔP)', () => {
  const spec = target({ waterDpBar: 0.1, flowBasis: { kind: 'spec', flowLh: 3600 } });
  it('brings a flow measured at half the specification ΔP to it: 100 %', () => {
    expect(recoveryPreview(spec, 'hot-water', undefined, 1800, { flowDpBar: 0.05 })?.pct).toBeCloseTo(100, 6);
  });
  it('at the specification ΔP, or with none given, the flow is taken as it is: 50 %', () => {
    expect(recoveryPreview(spec, 'hot-water', undefined, 1800, { flowDpBar: 0.1 })?.pct).toBeCloseTo(50, 6);
    expect(recoveryPreview(spec, 'hot-water', undefined, 1800)?.pct).toBeCloseTo(50, 6);
  });
});
