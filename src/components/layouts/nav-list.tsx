import type { CSSProperties, ReactNode } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { cn } from '@/utils/cn';

export type NavListItem = { to: string; label: string; icon: ReactNode };

/**
 * The link of the page shown: the most specific one whose address starts the current one (the
 * Change log, /records/changes, rather than Records, /records).
 */
export function currentNavItem(items: readonly NavListItem[], pathname: string): string | undefined {
  const path = pathname.length > 1 ? pathname.replace(/\/+$/, '') : pathname;
  return items
    .filter((i) => path === i.to || path.startsWith(i.to.endsWith('/') ? i.to : `${i.to}/`))
    .sort((a, b) => b.to.length - a.to.length)[0]?.to;
}

/** The links of a section nav, one marked current on its page (the top tabs and the phone's bottom bar). */
export function NavList({ items, className, style, link, active, idle }: { items: NavListItem[]; className: string; style?: CSSProperties; link: string; active: string; idle: string }) {
  const current = currentNavItem(items, useLocation().pathname);
  return (
    <ul className={className} style={style}>
      {items.map((item) => (
        <li key={item.to}>
          <Link to={item.to} aria-current={item.to === current ? 'page' : undefined} className={cn(link, item.to === current ? active : idle)}>
            {item.icon}
            {item.label}
          </Link>
        </li>
      ))}
    </ul>
  );
}
