import { createRef } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { Button } from './button';

describe('Button', () => {
  it('is type="button" by default and forwards its ref', () => {
    const ref = createRef<HTMLButtonElement>();
    render(<Button ref={ref}>Log reading</Button>);
    const button = screen.getByRole('button', { name: 'Log reading' }) as HTMLButtonElement;
    expect(button.type).toBe('button');
    expect(ref.current).toBe(button);
  });

  it('sets aria-busy and disables while loading', () => {
    const onClick = vi.fn();
    render(
      <Button loading onClick={onClick}>
        Approve plan
      </Button>,
    );
    const button = screen.getByRole('button', { name: 'Approve plan' }) as HTMLButtonElement;
    expect(button.getAttribute('aria-busy')).toBe('true');
    expect(button.disabled).toBe(true);
    fireEvent.click(button);
    expect(onClick).not.toHaveBeenCalled();
  });
});
