import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { FormField } from './form-field';
import { Input, NumberInput } from './input';

describe('FormField', () => {
  it('links hint and error to the control and marks it invalid', () => {
    render(
      <FormField label="Flow" htmlFor="flow" hint="At the filter inlet" error="Enter a flow above 0 L/h.">
        <NumberInput id="flow" unit="L/h" defaultValue="0" />
      </FormField>,
    );
    const input = screen.getByLabelText('Flow') as HTMLInputElement;
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('Enter a flow above 0 L/h.');
    const describedBy = (input.getAttribute('aria-describedby') ?? '').split(' ');
    expect(describedBy).toContain(alert.id);
    expect(describedBy).toContain('flow-hint');
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(input.inputMode).toBe('decimal');
  });

  it('leaves the control valid without an error', () => {
    render(
      <FormField label="Lot" htmlFor="lot">
        <Input id="lot" />
      </FormField>,
    );
    const input = screen.getByLabelText('Lot');
    expect(input.hasAttribute('aria-invalid')).toBe(false);
    expect(input.hasAttribute('aria-describedby')).toBe(false);
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
