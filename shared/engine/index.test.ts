import { describe, expect, it } from 'vitest';
import * as engine from './index';

// The public surface outside scripts call: names must stay exactly as published.
const surface = [
  'waterViscosity',
  'waterViscosityAt',
  'waterDensity',
  'waterSurfaceTension',
  'ethanolMassFraction',
  'ethanolWaterDensity',
  'ethanolWaterViscosity',
  'wineViscosity',
  'mediumResistance',
  'cleanDpBar',
  'frictionFactor',
  'lineLossBar',
  'blockingVolume',
  'blockingFlux',
  'blockingPressureRatio',
  'blockingVolumeAtRatio',
  'fitConstantFlow',
  'volumeAtDp',
  'cloggingIndex',
  'vmaxArea',
  'allowedPressureDecayMbar',
  'convert',
  'sizeTrain',
  'suggestTrain',
  'fitConstantPressure',
  'forecastRun',
  'cartridgeLife',
  'buildDayTimeline',
  'lotReadiness',
] as const;

describe('engine public surface', () => {
  it.each(surface)('exports %s as a function', (name) => {
    expect(typeof (engine as Record<string, unknown>)[name]).toBe('function');
  });

  it('is pure: the same input gives the same output', () => {
    const a = engine.wineViscosity({ tempC: 12, ethanolPctVol: 13, sugarGPerL: 4 });
    const b = engine.wineViscosity({ tempC: 12, ethanolPctVol: 13, sugarGPerL: 4 });
    expect(a).toBe(b);
  });
});
