import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { cn } from '@/utils/cn';

export type PhoneNavItem = { to: string; label: string; icon: ReactNode };

/** Phones: the person's main cellar sections in a bar at the bottom, one tap away. */
export function PhoneNav({ items }: { items: PhoneNavItem[] }) {
  if (items.length === 0) return null;
  return (
    <nav aria-label="Cellar shortcuts" className="fixed inset-x-0 bottom-0 z-30 border-t border-ink-200 bg-white pb-[env(safe-area-inset-bottom)] sm:hidden">
      <ul className="grid" style={{ gridTemplateColumns: `repeat(${String(items.length)}, minmax(0, 1fr))` }}>
        {items.map((item) => (
          <li key={item.to}>
            <NavLink
              to={item.to}
              className={({ isActive }) =>
                cn(
                  'flex min-h-14 flex-col items-center justify-center gap-0.5 text-xs font-semibold [&_svg]:size-5',
                  isActive ? 'text-primary-800' : 'text-ink-600',
                )
              }
            >
              {item.icon}
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
