import { useEffect, useId, useRef, type KeyboardEvent, type MouseEvent, type ReactNode } from 'react';
import { X } from 'lucide-react';
import { cn } from '@/utils/cn';

export interface DialogProps {
  open: boolean;
  /** Called on Escape, the close button, a backdrop click or a native close. */
  onClose: () => void;
  title: ReactNode;
  description?: ReactNode;
  children?: ReactNode;
  /** Actions, e.g. a secondary "Cancel" and a primary "Approve plan". */
  footer?: ReactNode;
  /** Close when the dimmed area around the dialog is clicked. Default true. */
  closeOnBackdrop?: boolean;
  size?: 'sm' | 'md' | 'lg';
  className?: string;
}

const FOCUSABLE =
  'a[href], button:not([disabled]), input:not([disabled]):not([type="hidden"]), select:not([disabled]), textarea:not([disabled]), [tabindex]:not([tabindex="-1"])';

const widths = {
  sm: 'w-[min(26rem,calc(100vw-2rem))]',
  md: 'w-[min(34rem,calc(100vw-2rem))]',
  lg: 'w-[min(48rem,calc(100vw-2rem))]',
};

/**
 * Modal dialog on the native <dialog> element. Focus moves to the first element marked
 * data-autofocus (or the first focusable element) and returns to the opener on close.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  footer,
  closeOnBackdrop = true,
  size = 'md',
  className,
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const onCloseRef = useRef(onClose);
  onCloseRef.current = onClose;
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open) {
      returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      if (!dialog.open) {
        if (typeof dialog.showModal === 'function') dialog.showModal();
        else dialog.setAttribute('open', '');
      }
      const target =
        dialog.querySelector<HTMLElement>('[data-autofocus]') ??
        dialog.querySelector<HTMLElement>(`[data-dialog-body] :is(${FOCUSABLE})`) ??
        dialog.querySelector<HTMLElement>(FOCUSABLE);
      target?.focus();
      return () => {
        closeNative(dialog);
        const back = returnFocus.current;
        returnFocus.current = null;
        if (back && back.isConnected) back.focus();
      };
    }
    closeNative(dialog);
    return undefined;
  }, [open]);

  const handleKeyDown = (event: KeyboardEvent<HTMLDialogElement>) => {
    if (event.key === 'Escape') {
      event.preventDefault();
      event.stopPropagation();
      onCloseRef.current();
    }
  };

  const handleClick = (event: MouseEvent<HTMLDialogElement>) => {
    // A click whose target is the <dialog> itself landed on the backdrop (the panel fills it).
    if (closeOnBackdrop && event.target === event.currentTarget) onCloseRef.current();
  };

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      aria-modal="true"
      onKeyDown={handleKeyDown}
      onCancel={(event) => {
        event.preventDefault();
        onCloseRef.current();
      }}
      onClose={() => {
        if (open) onCloseRef.current();
      }}
      onClick={handleClick}
      className={cn(
        'm-auto max-h-[calc(100dvh-2rem)] rounded-md border border-ink-200 bg-white p-0 text-ink-900 shadow-float',
        widths[size],
        className,
      )}
    >
      {open ? (
        <div className="flex max-h-[calc(100dvh-2rem)] flex-col">
          <header className="flex items-start gap-3 border-b border-ink-200 px-5 pt-4 pb-3">
            <div className="min-w-0 flex-1">
              <h2 id={titleId} className="text-lg font-semibold text-ink-950">
                {title}
              </h2>
              {description ? (
                <p id={descriptionId} className="mt-1 text-sm text-ink-600">
                  {description}
                </p>
              ) : null}
            </div>
            <button
              type="button"
              aria-label="Close"
              onClick={() => onCloseRef.current()}
              className="-mt-1 -mr-2 inline-flex size-11 shrink-0 items-center justify-center rounded text-ink-600 hover:bg-ink-100 hover:text-ink-900"
            >
              <X aria-hidden="true" className="size-5" />
            </button>
          </header>
          {children ? (
            <div data-dialog-body="" className="min-h-0 flex-1 overflow-y-auto px-5 py-4">
              {children}
            </div>
          ) : null}
          {footer ? (
            <footer className="flex flex-col-reverse gap-2 border-t border-ink-200 bg-ink-50 px-5 py-3 sm:flex-row sm:justify-end">
              {footer}
            </footer>
          ) : null}
        </div>
      ) : null}
    </dialog>
  );
}

function closeNative(dialog: HTMLDialogElement) {
  if (!dialog.open && !dialog.hasAttribute('open')) return;
  if (typeof dialog.close === 'function') dialog.close();
  else dialog.removeAttribute('open');
}
