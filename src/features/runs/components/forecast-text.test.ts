import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatQuantity, type RunForecast } from '@shared/engine';
import { forecastView } from './forecast-text';

const volume = (l: number) => formatQuantity('volume', l, 'metric');

function forecast(over: Partial<RunForecast> = {}): RunForecast {
  return {
    law: 'cake',
    terminalDpBar: 1,
    currentVolumeL: 2000,
    volumeAtTerminalL: 2500,
    volumeSeL: 50,
    volumeLeftL: 500,
    low: 400,
    high: 600,
    hoursLeft: 0.35,
    hoursLeftLow: 0.28,
    hoursLeftHigh: 0.42,
    timeLeft: { hours: 0, minutes: 21 },
    reachedTerminal: false,
    beyondReadings: false,
    dof: 10,
    tValue: 2.228,
    weights: { cake: 1 },
    basis: 'readings',
    segmentStartL: 0,
    volumeSeenL: 2000,
    ...over,
  };
}

describe('forecastView (common practice, no source: honest words for a forecast)', () => {
  it('reads "about 21 min", never "0:21"', () => {
    const v = forecastView(forecast(), null, volume);
    expect(v).toEqual({ kind: 'figure', headline: '≈ 500 L left · about 21 min', band: '≈95 % band 400 L – 600 L' });
  });

  it('says "beyond the readings" without a bare number', () => {
    const v = forecastView(forecast({ beyondReadings: true, volumeLeftL: 7.8e27 }), null, volume);
    expect(v.kind).toBe('beyond');
    expect(JSON.stringify(v)).not.toMatch(/7,8|e\+|Infinity|NaN/);
  });

  it('gives the server’s words when there is no forecast', () => {
    expect(forecastView(null, 'ΔP is not rising on these readings', volume)).toEqual({ kind: 'none', headline: 'ΔP is not rising on these readings' });
  });

  it('property: no non-finite or absurd figure ever reaches the text', () => {
    const wild = fc.oneof(fc.double(), fc.constantFrom(Number.NaN, Infinity, -Infinity, 1e30, -5));
    fc.assert(
      fc.property(wild, wild, wild, wild, fc.boolean(), (left, low, high, hours, beyond) => {
        const v = forecastView(forecast({ volumeLeftL: left, low, high, hoursLeft: hours, beyondReadings: beyond }), null, volume);
        const text = Object.values(v).join(' ');
        expect(text).not.toMatch(/NaN|Infinity|e\+|e-\d|\d:\d\d/);
        expect(text).not.toMatch(/\d{1,3}(,\d{3}){3,}/); // nothing of a billion litres or more
      }),
    );
  });
});
