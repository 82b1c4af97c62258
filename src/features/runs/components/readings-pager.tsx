import type { ReactNode } from 'react';
import { Pager } from '@/components/ui/pager';
import { cn } from '@/utils/cn';

/** Newer / Older through a run's stored readings, with the page number (and whatever `extra` adds, e.g. the count). */
export function ReadingsPager({ label, page, pages, onPageChange, extra, className }: { label: string; page: number; pages: number; onPageChange: (page: number) => void; extra?: ReactNode; className?: string }) {
  return (
    <Pager label={label} page={page} pages={pages} onPageChange={onPageChange} previous="Newer" next="Older" variant="ghost" className={cn('flex-wrap', className)}>
      <span className="num text-sm text-ink-600">
        Page {page.toLocaleString('en')} of {pages.toLocaleString('en')}
        {extra}
      </span>
    </Pager>
  );
}
