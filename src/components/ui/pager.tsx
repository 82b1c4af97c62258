import type { ReactNode } from 'react';
import { cn } from '@/utils/cn';
import { Button, type ButtonSize, type ButtonVariant } from './button';

export interface PagerProps {
  /** The nav's accessible name ("Pages of lots", …). */
  label: string;
  /** The page shown, from 1. */
  page: number;
  /** How many pages there are; nothing is drawn for one page or none. */
  pages: number;
  onPageChange: (page: number) => void;
  /** The back button's content ("Newer", "Previous", an icon) and, for an icon, its accessible name. */
  previous: ReactNode;
  previousLabel?: string;
  /** The forward button's content ("Older", "Next", an icon) and, for an icon, its accessible name. */
  next: ReactNode;
  nextLabel?: string;
  /** What stands between the buttons: the page number, the count, … */
  children: ReactNode;
  variant?: ButtonVariant;
  size?: ButtonSize;
  buttonClassName?: string;
  /** `spread`: the buttons at either end (the default); `start`: all three side by side at the start. */
  align?: 'spread' | 'start';
  className?: string;
}

/** One step back or forward through a paged list, never past the first or the last page. */
export function Pager({ label, page, pages, onPageChange, previous, previousLabel, next, nextLabel, children, variant = 'secondary', size = 'md', buttonClassName, align = 'spread', className }: PagerProps) {
  if (pages <= 1) return null;
  return (
    <nav aria-label={label} className={cn('flex items-center gap-2', align === 'spread' && 'justify-between', className)}>
      <Button variant={variant} size={size} className={buttonClassName} aria-label={previousLabel} disabled={page <= 1} onClick={() => onPageChange(Math.max(1, page - 1))}>
        {previous}
      </Button>
      {children}
      <Button variant={variant} size={size} className={buttonClassName} aria-label={nextLabel} disabled={page >= pages} onClick={() => onPageChange(Math.min(pages, page + 1))}>
        {next}
      </Button>
    </nav>
  );
}
