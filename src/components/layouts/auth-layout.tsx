import type { ReactNode } from 'react';
import { Wordmark } from './brand-mark';

/** The frame of the signed-out pages: mark, one card, a quiet line about what Porewise is. */
export function AuthLayout({ title, description, children, footer }: { title: string; description?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col items-center bg-ink-50 px-4 py-10 sm:py-16">
      <Wordmark className="mb-8" />
      <main className="w-full max-w-md rounded-md border border-ink-200 bg-white p-6 sm:p-8">
        <h1 className="text-xl font-semibold text-ink-900">{title}</h1>
        {description ? <p className="mt-1 text-sm text-ink-600">{description}</p> : null}
        <div className="mt-6">{children}</div>
      </main>
      {footer ? <div className="mt-6 text-sm text-ink-600">{footer}</div> : null}
      <p className="mt-10 max-w-md text-center text-xs text-ink-500">
        Filtration planning, run tracking and cartridge life for winery cellar teams.
      </p>
    </div>
  );
}
