// The lean forecast for many cartridges (Today) must agree with the full one, field for
// field, whatever the history: a property test over random ratings and histories (fast-check).
// No outside source is needed: the reference is cartridgeLife itself, tested against its
// sources in cartridge-life.test.ts.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CARE_CYCLE_KINDS, cartridgeLife, cartridgeLifeVerdict, type CartridgeHistory, type CartridgeLifeOptions, type CartridgeRatings } from './cartridge-life';

const optionalPositive = fc.option(fc.double({ min: 0.5, max: 500, noNaN: true }), { nil: undefined });
const optionalCount = fc.option(fc.integer({ min: 1, max: 120 }), { nil: undefined });

const ratings: fc.Arbitrary<CartridgeRatings> = fc.record({
  ratedSteamCycles: optionalCount,
  ratedHotWaterCycles: optionalCount,
  ratedChemicalCycles: optionalCount,
  ratedLitres: fc.option(fc.double({ min: 1, max: 5e6, noNaN: true }), { nil: undefined }),
  ratedSteamMinutes: fc.option(fc.double({ min: 1, max: 5000, noNaN: true }), { nil: undefined }),
  flowRecoveryMinPct: fc.double({ min: 1, max: 100, noNaN: true }),
});

const cycle = fc.record({
  kind: fc.constantFrom(...CARE_CYCLE_KINDS),
  tempC: fc.option(fc.double({ min: 0, max: 200, noNaN: true }), { nil: undefined }),
  durationMin: fc.option(fc.double({ min: 0, max: 120, noNaN: true }), { nil: undefined }),
  waterFlowBeforeLh: fc.option(fc.double({ min: 0, max: 2000, noNaN: true }), { nil: undefined }),
  waterFlowAfterLh: fc.option(fc.double({ min: 0, max: 2000, noNaN: true }), { nil: undefined }),
  atMs: fc.option(fc.integer({ min: 1.6e12, max: 1.8e12 }), { nil: undefined }),
});

const history: fc.Arbitrary<CartridgeHistory> = fc.record({
  litresFiltered: fc.double({ min: 0, max: 1e6, noNaN: true }),
  cycles: fc.array(cycle, { maxLength: 40 }),
  integrity: fc.array(fc.record({ pass: fc.boolean(), atMs: fc.option(fc.integer({ min: 1.6e12, max: 1.8e12 }), { nil: undefined }) }), { maxLength: 6 }),
  waterFlowNewLh: optionalPositive,
});

const options: fc.Arbitrary<CartridgeLifeOptions> = fc.record({
  cyclesPerWeek: fc.option(fc.double({ min: 0.1, max: 20, noNaN: true }), { nil: undefined }),
  nowMs: fc.option(fc.integer({ min: 1.6e12, max: 1.8e12 }), { nil: undefined }),
  integrityRule: fc.constantFrom<CartridgeLifeOptions['integrityRule']>(undefined, 'latest', 'any'),
});

describe('cartridgeLifeVerdict', () => {
  it('gives every figure and the verdict of cartridgeLife, without the plain-words account', () => {
    fc.assert(
      fc.property(ratings, history, options, (r, h, o) => {
        let whole: ReturnType<typeof cartridgeLife>;
        try {
          whole = cartridgeLife(r, h, o);
        } catch (error) {
          // Input the forecast refuses (e.g. a recovery that overflows): the lean one refuses it the same way.
          expect(() => cartridgeLifeVerdict(r, h, o)).toThrow((error as Error).message);
          return;
        }
        // eslint-disable-next-line @typescript-eslint/no-unused-vars
        const { known, missing, ...full } = whole;
        const lean = cartridgeLifeVerdict(r, h, o);
        expect(lean).toStrictEqual(full);
        expect('known' in lean || 'missing' in lean).toBe(false);
      }),
      { numRuns: 1000 },
    );
  });

  it('throws the same RangeError as cartridgeLife for input out of range', () => {
    const bad: [CartridgeRatings, CartridgeHistory][] = [
      [{ flowRecoveryMinPct: 0 }, { litresFiltered: 0, cycles: [] }],
      [{ flowRecoveryMinPct: 60 }, { litresFiltered: -1, cycles: [] }],
      [{ flowRecoveryMinPct: 60, ratedSteamCycles: -3 }, { litresFiltered: 0, cycles: [] }],
      [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [{ kind: 'steam', tempC: 400 }] }],
    ];
    for (const [r, h] of bad) {
      expect(() => cartridgeLife(r, h)).toThrow(RangeError);
      let message = '';
      try {
        cartridgeLife(r, h);
      } catch (e) {
        message = (e as Error).message;
      }
      expect(() => cartridgeLifeVerdict(r, h)).toThrow(message);
    }
  });
});
