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
});
