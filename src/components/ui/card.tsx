import { useId, type HTMLAttributes, type ReactNode } from 'react';
import { cn } from '@/utils/cn';

type HeadingLevel = 2 | 3 | 4;

export interface CardProps extends Omit<HTMLAttributes<HTMLElement>, 'title'> {
  title?: ReactNode;
  description?: ReactNode;
  /** Commands for this card, shown at the right of the heading. */
  actions?: ReactNode;
  /** Heading level for the title. Default 2. */
  level?: HeadingLevel;
  /** Remove body padding (e.g. a table that fills the card). */
  flush?: boolean;
  children?: ReactNode;
}

function Heading({ level, id, children }: { level: HeadingLevel; id: string; children: ReactNode }) {
  const Tag = `h${level}` as const;
  return (
    <Tag id={id} className="text-lg font-semibold text-ink-950">
      {children}
    </Tag>
  );
}

/** A framed block: 1 px border, small radius, optional heading row. */
export function Card({ title, description, actions, level = 2, flush, className, children, ...rest }: CardProps) {
  const headingId = useId();
  return (
    <section
      aria-labelledby={title ? headingId : undefined}
      className={cn('rounded border border-ink-200 bg-white', className)}
      {...rest}
    >
      {title || actions ? (
        <div className="flex flex-wrap items-start justify-between gap-x-4 gap-y-2 border-b border-ink-200 px-4 py-3">
          <div className="min-w-0">
            {title ? (
              <Heading level={level} id={headingId}>
                {title}
              </Heading>
            ) : null}
            {description ? <p className="mt-0.5 text-sm text-ink-600">{description}</p> : null}
          </div>
          {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
        </div>
      ) : null}
      <div className={flush ? undefined : 'px-4 py-3'}>{children}</div>
    </section>
  );
}

export interface SectionProps extends Omit<HTMLAttributes<HTMLElement>, 'title'> {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  level?: HeadingLevel;
  children?: ReactNode;
}

/** An unframed page section: heading row with a rule beneath it. */
export function Section({ title, description, actions, level = 2, className, children, ...rest }: SectionProps) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className={cn('flex flex-col gap-3', className)} {...rest}>
      <div className="flex flex-wrap items-end justify-between gap-x-4 gap-y-2 border-b border-ink-200 pb-2">
        <div className="min-w-0">
          <Heading level={level} id={headingId}>
            {title}
          </Heading>
          {description ? <p className="mt-0.5 text-sm text-ink-600">{description}</p> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      <div>{children}</div>
    </section>
  );
}
