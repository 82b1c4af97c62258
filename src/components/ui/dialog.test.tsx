import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { act, fireEvent, render, screen } from '@testing-library/react';
import { Dialog } from './dialog';
import { Button } from './button';
import { ToastProvider, useToast } from './toast';

function Harness({ onClose }: { onClose?: () => void }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button onClick={() => setOpen(true)}>Open</Button>
      <Dialog
        open={open}
        onClose={() => {
          onClose?.();
          setOpen(false);
        }}
        title="Retire cartridge"
        description="It stays in the history."
        footer={<Button onClick={() => setOpen(false)}>Retire</Button>}
      >
        <input aria-label="Reason" />
      </Dialog>
    </>
  );
}

describe('Dialog', () => {
  it('opens, focuses its first field, closes on Escape and returns focus', () => {
    const onClose = vi.fn();
    render(<Harness onClose={onClose} />);
    const opener = screen.getByRole('button', { name: 'Open' });
    opener.focus();
    fireEvent.click(opener);
    const dialog = document.querySelector('dialog') as HTMLDialogElement;
    expect(dialog.hasAttribute('open')).toBe(true);
    expect(screen.getByText('Retire cartridge').id).toBe(dialog.getAttribute('aria-labelledby'));
    expect(document.activeElement).toBe(screen.getByLabelText('Reason'));

    fireEvent.keyDown(dialog, { key: 'Escape' });
    expect(onClose).toHaveBeenCalledTimes(1);
    expect(dialog.hasAttribute('open')).toBe(false);
    expect(document.activeElement).toBe(opener);
  });
});

function ToastButton() {
  const toast = useToast();
  return <Button onClick={() => toast.success('Reading saved')}>Save</Button>;
}

describe('Toast', () => {
  it('announces in a polite live region, dismisses by button and by timer', () => {
    vi.useFakeTimers();
    try {
      render(
        <ToastProvider>
          <ToastButton />
        </ToastProvider>,
      );
      const region = screen.getByRole('region', { name: 'Notifications' });
      expect(region.getAttribute('aria-live')).toBe('polite');

      fireEvent.click(screen.getByRole('button', { name: 'Save' }));
      expect(region.textContent).toContain('Reading saved');
      fireEvent.click(screen.getByRole('button', { name: 'Dismiss' }));
      expect(region.textContent).not.toContain('Reading saved');

      fireEvent.click(screen.getByRole('button', { name: 'Save' }));
      expect(region.textContent).toContain('Reading saved');
      act(() => {
        vi.advanceTimersByTime(6000);
      });
      expect(region.textContent).not.toContain('Reading saved');
    } finally {
      vi.useRealTimers();
    }
  });
});
