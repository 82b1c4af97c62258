import { CircleCheck } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

/** The card's text when nothing needs a look. */
export function AllClear({ children }: { children: ReactNode }) {
  return (
    <p className="flex items-start gap-2 px-4 py-4 text-ink-700">
      <CircleCheck aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-ok-600" />
      {children}
    </p>
  );
}

/**
 * What to look at, most urgent first (`children`: one `LookAtRow` each); when Today shows only the
 * first `shown` of `total`, a line says so with a link to the whole list.
 */
export function LookAtList({ label, shown, total, moreTo, moreLabel, children }: { label: string; shown: number; total: number; moreTo: string; moreLabel: string; children: ReactNode }) {
  return (
    <>
      <ul className="divide-y divide-ink-200" aria-label={label}>
        {children}
      </ul>
      {total > shown ? (
        <p className="border-t border-ink-200 px-4 py-2 text-sm text-ink-700">
          Showing <span className="num">{shown}</span> of <span className="num">{total}</span>.{' '}
          <Link to={moreTo} className="inline-flex min-h-11 items-center font-semibold text-primary-700 underline underline-offset-2">
            {moreLabel}
          </Link>
        </p>
      ) : null}
    </>
  );
}

/** One record to look at: a link to its page with its code and name, its badge, and the lines that say why. */
export function LookAtRow({ to, code, name, badge, children }: { to: string; code: string; name: string; badge: ReactNode; children: ReactNode }) {
  return (
    <li>
      <Link to={to} className="block min-h-11 px-4 py-2.5 hover:bg-ink-50 active:bg-ink-100">
        <span className="flex items-start justify-between gap-3">
          <span className="min-w-0">
            <span className="font-semibold text-primary-700">{code}</span> <span className="text-ink-900">{name}</span>
          </span>
          {badge}
        </span>
        {children}
      </Link>
    </li>
  );
}
