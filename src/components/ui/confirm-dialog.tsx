import type { ReactNode } from 'react';
import { Button, type ButtonSize, type ButtonVariant } from './button';
import { Dialog } from './dialog';

export interface ConfirmDialogProps {
  open: boolean;
  /** The back-out button and closing the dialog. */
  onClose: () => void;
  title: ReactNode;
  description?: ReactNode;
  /** "Keep", "Cancel", … */
  cancelLabel: string;
  /** "Delete tank", "Remove from winery", … */
  confirmLabel: string;
  onConfirm: () => void;
  pending: boolean;
  /** Danger by default (a delete); `primary` for an everyday step. */
  variant?: ButtonVariant;
  buttonSize?: ButtonSize;
  children?: ReactNode;
}

/** Asks once before an action: a small dialog with a back-out button and the action's own. */
export function ConfirmDialog({ open, onClose, title, description, cancelLabel, confirmLabel, onConfirm, pending, variant = 'danger', buttonSize, children }: ConfirmDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      size="sm"
      title={title}
      description={description}
      footer={
        <>
          <Button variant="secondary" size={buttonSize} onClick={onClose}>
            {cancelLabel}
          </Button>
          <Button variant={variant} size={buttonSize} loading={pending} onClick={onConfirm}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      {children}
    </Dialog>
  );
}
