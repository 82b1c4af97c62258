import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useMemo,
  useRef,
  useState,
  type ReactNode,
} from 'react';
import { CircleCheck, Info, OctagonX, X } from 'lucide-react';
import { cn } from '@/utils/cn';

export type ToastTone = 'success' | 'error' | 'info';

export interface ToastOptions {
  tone?: ToastTone;
  /** The short message, e.g. "Reading saved". */
  title: ReactNode;
  /** Optional second line, e.g. "Waiting to sync – will send when the signal is back." */
  description?: ReactNode;
  /** Milliseconds before it goes away; 0 keeps it until dismissed. */
  duration?: number;
}

export interface ToastItem extends Required<Pick<ToastOptions, 'tone' | 'duration'>> {
  id: string;
  title: ReactNode;
  description?: ReactNode;
}

export interface ToastApi {
  show: (options: ToastOptions) => string;
  success: (title: ReactNode, description?: ReactNode) => string;
  error: (title: ReactNode, description?: ReactNode) => string;
  info: (title: ReactNode, description?: ReactNode) => string;
  dismiss: (id: string) => void;
}

const ToastContext = createContext<ToastApi | null>(null);

const DEFAULT_DURATION: Record<ToastTone, number> = { success: 5000, info: 5000, error: 9000 };

const toneStyle: Record<ToastTone, { icon: typeof Info; frame: string; iconColour: string; word: string }> = {
  success: { icon: CircleCheck, frame: 'border-l-ok-500', iconColour: 'text-ok-600', word: 'Done' },
  error: { icon: OctagonX, frame: 'border-l-stop-600', iconColour: 'text-stop-600', word: 'Problem' },
  info: { icon: Info, frame: 'border-l-primary-600', iconColour: 'text-primary-700', word: 'Note' },
};

export interface ToastProviderProps {
  children: ReactNode;
  /** Most toasts kept on screen at once; older ones drop off. Default 4. */
  limit?: number;
}

export function ToastProvider({ children, limit = 4 }: ToastProviderProps) {
  const [toasts, setToasts] = useState<ToastItem[]>([]);
  const counter = useRef(0);

  const dismiss = useCallback((id: string) => {
    setToasts((list) => list.filter((t) => t.id !== id));
  }, []);

  const show = useCallback(
    ({ tone = 'info', title, description, duration }: ToastOptions) => {
      counter.current += 1;
      const id = `toast-${counter.current}`;
      const item: ToastItem = { id, tone, title, description, duration: duration ?? DEFAULT_DURATION[tone] };
      setToasts((list) => [...list, item].slice(-limit));
      return id;
    },
    [limit],
  );

  const api = useMemo<ToastApi>(
    () => ({
      show,
      dismiss,
      success: (title, description) => show({ tone: 'success', title, description }),
      error: (title, description) => show({ tone: 'error', title, description }),
      info: (title, description) => show({ tone: 'info', title, description }),
    }),
    [show, dismiss],
  );

  return (
    <ToastContext.Provider value={api}>
      {children}
      <div
        aria-live="polite"
        aria-relevant="additions text"
        role="region"
        aria-label="Notifications"
        className="pointer-events-none fixed inset-x-0 bottom-0 z-50 flex flex-col items-center gap-2 p-3 sm:items-end sm:p-4"
      >
        {toasts.map((t) => (
          <Toast key={t.id} item={t} onDismiss={dismiss} />
        ))}
      </div>
    </ToastContext.Provider>
  );
}

function Toast({ item, onDismiss }: { item: ToastItem; onDismiss: (id: string) => void }) {
  const [paused, setPaused] = useState(false);
  const style = toneStyle[item.tone];
  const Icon = style.icon;

  useEffect(() => {
    if (paused || item.duration <= 0) return undefined;
    const timer = setTimeout(() => onDismiss(item.id), item.duration);
    return () => clearTimeout(timer);
  }, [paused, item.duration, item.id, onDismiss]);

  return (
    <div
      data-tone={item.tone}
      onMouseEnter={() => setPaused(true)}
      onMouseLeave={() => setPaused(false)}
      onFocus={() => setPaused(true)}
      onBlur={() => setPaused(false)}
      className={cn(
        'pointer-events-auto flex w-full max-w-sm items-start gap-3 rounded border border-l-4 border-ink-200 bg-white py-2.5 pr-1 pl-3 text-ink-900 shadow-float',
        style.frame,
      )}
    >
      <Icon aria-hidden="true" className={cn('mt-0.5 size-5 shrink-0', style.iconColour)} />
      <div className="min-w-0 flex-1 py-0.5">
        <p className="text-base font-semibold">
          <span className="sr-only">{style.word}: </span>
          {item.title}
        </p>
        {item.description ? <p className="mt-0.5 text-sm text-ink-600">{item.description}</p> : null}
      </div>
      <button
        type="button"
        aria-label="Dismiss"
        onClick={() => onDismiss(item.id)}
        className="inline-flex size-11 shrink-0 items-center justify-center rounded text-ink-500 hover:bg-ink-100 hover:text-ink-900"
      >
        <X aria-hidden="true" className="size-4" />
      </button>
    </div>
  );
}

/** Access the toast API; must be used inside <ToastProvider>. */
export function useToast(): ToastApi {
  const ctx = useContext(ToastContext);
  if (!ctx) throw new Error('useToast must be used inside <ToastProvider>.');
  return ctx;
}
