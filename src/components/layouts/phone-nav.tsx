import { NavList, type NavListItem } from './nav-list';

/** Phones: the person's main cellar sections in a bar at the bottom, one tap away. */
export function PhoneNav({ items }: { items: NavListItem[] }) {
  if (items.length === 0) return null;
  return (
    <nav aria-label="Cellar shortcuts" className="fixed inset-x-0 bottom-0 z-30 border-t border-ink-200 bg-white pb-[env(safe-area-inset-bottom)] sm:hidden">
      <NavList
        items={items}
        className="grid"
        style={{ gridTemplateColumns: `repeat(${String(items.length)}, minmax(0, 1fr))` }}
        link="flex min-h-14 flex-col items-center justify-center gap-0.5 text-xs font-semibold [&_svg]:size-5"
        active="text-primary-800"
        idle="text-ink-600"
      />
    </nav>
  );
}
