import type { CSSProperties, ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { cn } from '@/utils/cn';

export type NavListItem = { to: string; label: string; icon: ReactNode };

/** The links of a section nav, each marked current on its page (the top tabs and the phone's bottom bar). */
export function NavList({ items, className, style, link, active, idle }: { items: NavListItem[]; className: string; style?: CSSProperties; link: string; active: string; idle: string }) {
  return (
    <ul className={className} style={style}>
      {items.map((item) => (
        <li key={item.to}>
          <NavLink to={item.to} className={({ isActive }) => cn(link, isActive ? active : idle)}>
            {item.icon}
            {item.label}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}
