import { describe, expect, it } from 'vitest';
import { fieldLabel, valueText } from './event-changes';

describe('change log wording', () => {
  it('names fields in words with their units', () => {
    expect(fieldLabel('volumeL')).toBe('Volume (L)');
    expect(fieldLabel('maxPressureBar')).toBe('Max pressure (bar)');
    expect(fieldLabel('tempC')).toBe('Temp (°C)');
    expect(fieldLabel('waterFlowLhPer10in')).toBe('Water flow (L/h per 10 in)');
    expect(fieldLabel('housingId')).toBe('Housing id');
    expect(fieldLabel('status')).toBe('Status');
  });
  it('shows values briefly and never a non-finite number', () => {
    expect(valueText(null)).toBe('—');
    expect(valueText(Number.NaN)).toBe('—');
    expect(valueText(true)).toBe('yes');
    expect(valueText('x'.repeat(300))).toHaveLength(121);
  });
  it('shows a train\'s stages in words, not as raw JSON', () => {
    const text = valueText([{ role: 'membrane', housingId: 'h1', capacityLPerM2: null }, { role: 'prefilter', housingId: 'h2' }]);
    expect(text).toBe('1) Role membrane, Housing id h1; 2) Role prefilter, Housing id h2');
    expect(text).not.toContain('{');
    expect(valueText([])).toBe('none');
    expect(valueText({ hoses: [{ lengthM: 5 }] })).toBe('Hoses (1) Length (m) 5)');
  });
});
