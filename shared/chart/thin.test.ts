import { describe, expect, it } from 'vitest';
import { chartPointsPerStage, thinSeries } from './thin';

// Min/max per bucket thinning: common practice for drawing long series, no source.
describe('thinSeries', () => {
  const series = (n: number) => Array.from({ length: n }, (_v, i) => ({ i, y: Math.sin(i / 50) + i / 1000 }));

  it('gives a short series back whole', () => {
    const s = series(10);
    expect(thinSeries(s, { max: 300, y: (p) => p.y })).toEqual(s);
  });

  it('keeps at most max points, the first, the last and the original order', () => {
    const s = series(5000);
    const out = thinSeries(s, { max: 300, y: (p) => p.y });
    expect(out.length).toBeLessThanOrEqual(300);
    expect(out.length).toBeGreaterThan(250);
    expect(out[0]).toBe(s[0]);
    expect(out.at(-1)).toBe(s[4999]);
    for (let k = 1; k < out.length; k++) expect(out[k].i).toBeGreaterThan(out[k - 1].i);
  });

  it('keeps the highest and lowest point of the series (a spike is never thinned away)', () => {
    const s = series(5000).map((p) => ({ ...p }));
    s[1234].y = 99;
    s[3210].y = -99;
    const out = thinSeries(s, { max: 300, y: (p) => p.y });
    expect(out).toContain(s[1234]);
    expect(out).toContain(s[3210]);
  });

  it('keeps every marked point, even past the budget', () => {
    const s = series(2000);
    const marked = new Set([5, 17, 999, 1500]);
    const out = thinSeries(s, { max: 50, y: (p) => p.y, keep: (p) => marked.has(p.i) });
    for (const i of marked) expect(out).toContain(s[i]);
    expect(out.length).toBeLessThanOrEqual(50);
  });
});

describe('chartPointsPerStage', () => {
  it('splits the run page budget over the stages, at least 50 each', () => {
    expect(chartPointsPerStage(1)).toBe(300);
    expect(chartPointsPerStage(2)).toBe(150);
    expect(chartPointsPerStage(10)).toBe(50);
    expect(chartPointsPerStage(0)).toBe(300);
  });
});
