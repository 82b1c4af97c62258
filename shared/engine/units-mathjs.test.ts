// The table of factors in units.ts against mathjs 15 (the converter Porewise used before):
// every pair of units of one kind, over many values, must give the same number to the last bit.
// The reference here is mathjs itself (an outside library), set up as units.ts used to set it up.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, createUnitDependencies, unitDependencies } from 'mathjs';
import { convert, isKnownUnit } from './units';

const math = create({ unitDependencies, createUnitDependencies });
math.createUnit('psi', { definition: '6894.757293168361 Pa' }, { override: true });
math.createUnit('gpm', { definition: '1 gal/min' });
math.createUnit('LMH', { definition: '1 L/(m^2 h)' });
math.createUnit('gfd', { definition: '1 gal/(ft^2 day)' });
math.createUnit('cP', { definition: '0.001 Pa s' });
math.createUnit('cSt', { definition: '1e-6 m^2/s' });
const byMathjs = (v: number, from: string, to: string) => math.unit(v, from).toNumber(to);

const groups = [
  ['Pa', 'kPa', 'bar', 'mbar', 'atm', 'psi', 'kgf/cm^2'],
  ['L', 'mL', 'hL', 'm^3', 'gal'],
  ['L/h', 'L/min', 'm^3/h', 'm^3/s', 'hL/h', 'gal/min', 'gpm'],
  ['degC', 'degF', 'K'],
  ['m^2', 'ft^2'],
  ['LMH', 'gfd', 'L/(m^2 h)', 'gal/(ft^2 day)', 'm/s'],
  ['mm', 'm', 'in', 'ft'],
  ['cP', 'Pa s'],
  ['cSt', 'mm^2/s'],
];
const pairs = groups.flatMap((g) => g.flatMap((a) => g.map((b) => [a, b] as const)));

describe('convert by factors equals mathjs', () => {
  it('for every pair of units of one kind, at round values', () => {
    for (const [a, b] of pairs) {
      for (const v of [0, 1, -1, 0.5, 2.5, 10, 20, 32, 68, 100, 212, 1000, 6000, 12_500, 1e6, -40, 273.15, 0.001]) {
        const ours = convert(v, a, b);
        const theirs = byMathjs(v, a, b);
        expect(Object.is(ours, theirs) || ours === theirs, `${String(v)} ${a} → ${b}: ${String(ours)} vs ${String(theirs)}`).toBe(true);
      }
    }
  });

  it('for every pair of units of one kind, at random values (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), fc.constantFrom(...pairs), (v, [a, b]) => {
        expect(convert(v, a, b)).toBe(byMathjs(v, a, b));
      }),
      { numRuns: 5000 },
    );
  });

  it('refuses units across kinds and unknown units, as mathjs does', () => {
    for (const [a, b] of [
      ['bar', 'L'],
      ['degC', 'm'],
      ['LMH', 'L/h'],
    ]) {
      expect(() => byMathjs(1, a, b)).toThrow();
      expect(() => convert(1, a, b)).toThrow(RangeError);
    }
    expect(isKnownUnit('furlongs-ish')).toBe(false);
    expect(() => convert(1, 'furlongs-ish', 'm')).toThrow(/Unknown unit/);
  });
});
