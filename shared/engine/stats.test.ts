import { describe, expect, it } from 'vitest';
import { incompleteBeta, logGamma, studentTCdf, studentTQuantile } from './stats';

describe('logGamma (Abramowitz & Stegun 6.1: Γ(n) = (n−1)!, Γ(½) = √π)', () => {
  it.each([
    [1, 0],
    [5, Math.log(24)],
    [0.5, 0.5 * Math.log(Math.PI)],
    [10, Math.log(362880)],
  ])('lnΓ(%s)', (x, v) => {
    expect(logGamma(x)).toBeCloseTo(v, 10);
  });
});

describe('incompleteBeta (A&S 26.5: I_x(1,1) = x, I_x(a,1) = x^a, I_½(a,a) = ½)', () => {
  it('matches the closed forms', () => {
    expect(incompleteBeta(0.3, 1, 1)).toBeCloseTo(0.3, 12);
    expect(incompleteBeta(0.3, 3, 1)).toBeCloseTo(0.027, 12);
    expect(incompleteBeta(0.5, 4.5, 4.5)).toBeCloseTo(0.5, 12);
  });
});

describe('Student t (NIST/SEMATECH e-Handbook of Statistical Methods, table 1.3.6.7.2, upper 2.5 % points)', () => {
  it.each([
    [1, 12.706],
    [2, 4.303],
    [3, 3.182],
    [5, 2.571],
    [10, 2.228],
    [30, 2.042],
    [100, 1.984],
  ])('t(0.975; %s) = %s', (dof, t) => {
    expect(studentTQuantile(0.975, dof)).toBeCloseTo(t, 3);
  });

  it('t with one degree of freedom is the Cauchy law: P(T ≤ 1) = 0.75 (A&S 26.7.3)', () => {
    expect(studentTCdf(1, 1)).toBeCloseTo(0.75, 12);
    expect(studentTQuantile(0.025, 4)).toBeCloseTo(-2.776, 3);
  });

  it('refuses a probability outside (0, 1)', () => {
    expect(() => studentTQuantile(1, 3)).toThrow(RangeError);
    expect(() => studentTQuantile(0.9, 0)).toThrow(RangeError);
  });
});
