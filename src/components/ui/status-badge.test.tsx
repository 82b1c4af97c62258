import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { StatusBadge } from './status-badge';
import { Quantity } from './quantity';
import { CautionPanel } from './caution';

describe('StatusBadge', () => {
  it('always shows its word, with an icon by default', () => {
    const { container } = render(<StatusBadge tone="watch">borderline</StatusBadge>);
    expect(screen.getByText('borderline')).toBeTruthy();
    expect(container.querySelector('svg')).not.toBeNull();
    expect(container.querySelector('[data-tone="watch"]')).not.toBeNull();
  });

  it('can drop the icon but keeps the word', () => {
    const { container } = render(
      <StatusBadge tone="stop" icon={null}>
        not ready
      </StatusBadge>,
    );
    expect(screen.getByText('not ready')).toBeTruthy();
    expect(container.querySelector('svg')).toBeNull();
  });
});

describe('Quantity', () => {
  it('renders the figure and its unit separately', () => {
    const { container } = render(<Quantity value="1.42" unit="bar" />);
    expect(container.textContent).toBe('1.42\u00a0bar');
    expect(container.firstElementChild?.className).toContain('num');
  });
});

describe('CautionPanel', () => {
  it('is a labelled note, not a dialog', () => {
    render(<CautionPanel title="Hot water">Wear gloves; hoses get hot.</CautionPanel>);
    const note = screen.getByRole('note', { name: /Hot water/ });
    expect(note.textContent).toContain('Wear gloves');
    expect(screen.queryByRole('dialog')).toBeNull();
  });
});
