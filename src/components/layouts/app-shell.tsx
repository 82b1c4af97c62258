import { CalendarCheck, ClipboardList, Cylinder, Droplets, FileText, Filter, Gauge, History, Inbox, Settings as SettingsIcon, Users, Wine } from 'lucide-react';
import { useEffect, useRef, type ReactNode } from 'react';
import { NavLink, useLocation, useNavigate } from 'react-router-dom';
import { can, roleLabels, type Action } from '@shared/permissions';
import type { MeDto } from '@shared/types/api';
import { OfflineBar } from '@/components/offline/offline-bar';
import { Select } from '@/components/ui/select';
import { paths } from '@/config/paths';
import { activeMembership, useAppInfo, useSetActiveWinery } from '@/lib/session';
import { BrandMark } from './brand-mark';
import { NavList } from './nav-list';
import { PhoneNav } from './phone-nav';
import { SignOutButton } from './sign-out-button';

/** The sections a phone's bottom bar offers (those the role may read). */
const phoneSections: string[] = [paths.today, paths.runs, paths.care, paths.cartridges];

type NavItem = { to: string; label: string; icon: ReactNode; action: Action; devOnly?: boolean };

/** Only built sections appear here; each is shown when the person's role may read it. */
const navItems: NavItem[] = [
  { to: paths.today, label: 'Today', icon: <CalendarCheck aria-hidden="true" className="size-4" />, action: 'cellar:read' },
  { to: paths.cellar, label: 'Cellar', icon: <Wine aria-hidden="true" className="size-4" />, action: 'cellar:read' },
  { to: paths.equipment, label: 'Equipment', icon: <Cylinder aria-hidden="true" className="size-4" />, action: 'equipment:read' },
  { to: paths.cartridges, label: 'Cartridges', icon: <Filter aria-hidden="true" className="size-4" />, action: 'cartridges:read' },
  { to: paths.plans, label: 'Plans', icon: <ClipboardList aria-hidden="true" className="size-4" />, action: 'plans:read' },
  { to: paths.runs, label: 'Runs', icon: <Gauge aria-hidden="true" className="size-4" />, action: 'runs:read' },
  { to: paths.care, label: 'Care', icon: <Droplets aria-hidden="true" className="size-4" />, action: 'care:read' },
  { to: paths.records, label: 'Records', icon: <FileText aria-hidden="true" className="size-4" />, action: 'records:read' },
  { to: paths.recordsChanges, label: 'Change log', icon: <History aria-hidden="true" className="size-4" />, action: 'audit:read' },
  { to: paths.team, label: 'Team', icon: <Users aria-hidden="true" className="size-4" />, action: 'team:read' },
  { to: paths.settings, label: 'Settings', icon: <SettingsIcon aria-hidden="true" className="size-4" />, action: 'settings:read' },
  { to: paths.outbox, label: 'Mail outbox', icon: <Inbox aria-hidden="true" className="size-4" />, action: 'mail-outbox:read', devOnly: true },
];

/** `headerExtra`: what the app adds beside the person's name (the notification bell). */
export function AppShell({ me, children, headerExtra }: { me: MeDto; children: ReactNode; headerExtra?: ReactNode }) {
  const navigate = useNavigate();
  const switchWinery = useSetActiveWinery();
  const appInfo = useAppInfo();
  const membership = activeMembership(me);
  const items = navItems.filter((i) => can(membership?.role, i.action) && (!i.devOnly || appInfo.data?.mailOutbox));
  const navRef = useRef<HTMLElement>(null);
  const { pathname } = useLocation();
  // On a phone the section tabs scroll sideways: keep the current one in view.
  useEffect(() => {
    navRef.current?.querySelector<HTMLElement>('[aria-current="page"]')?.scrollIntoView?.({ block: 'nearest', inline: 'nearest' });
  }, [pathname]);

  return (
    <div className="flex min-h-dvh flex-col bg-ink-50">
      <header className="border-b border-ink-200 bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-2 px-4 py-2">
          <NavLink to={paths.home} className="flex items-center gap-2" aria-label="Porewise home">
            <BrandMark className="size-7" />
            <span className="hidden text-lg font-semibold text-ink-900 sm:inline">Porewise</span>
          </NavLink>
          <div className="flex min-w-0 flex-1 items-center gap-2" data-testid="winery">
            {me.memberships.length > 1 ? (
              <Select
                aria-label="Winery"
                value={me.activeWineryId ?? ''}
                onChange={(e) => switchWinery.mutate(e.target.value, { onSuccess: () => navigate(paths.home) })}
                options={me.memberships.map((m) => ({ value: m.wineryId, label: m.wineryName }))}
                wrapperClassName="max-w-56"
              />
            ) : (
              <span className="truncate font-semibold text-ink-900">{membership?.wineryName ?? 'No winery'}</span>
            )}
            {membership ? <span className="hidden text-sm text-ink-600 sm:inline">{roleLabels[membership.role]}</span> : null}
          </div>
          <div className="flex items-center gap-2" data-testid="person">
            {headerExtra}
            <span className="hidden max-w-48 truncate text-sm text-ink-700 md:inline" title={me.user.email}>
              {me.user.name}
            </span>
            <SignOutButton />
          </div>
        </div>
        <nav ref={navRef} aria-label="Sections" className="mx-auto max-w-6xl overflow-x-auto px-2">
          <NavList
            items={items}
            className="flex gap-1"
            link="flex min-h-11 items-center gap-2 border-b-2 px-3 text-sm font-semibold whitespace-nowrap"
            active="border-primary-600 text-primary-800"
            idle="border-transparent text-ink-600 hover:text-ink-900"
          />
        </nav>
      </header>
      <OfflineBar />
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">{children}</main>
      <PhoneNav items={items.filter((i) => phoneSections.includes(i.to))} />
      <footer className="border-t border-ink-200 bg-white pb-16 sm:pb-0">
        <p className="mx-auto max-w-6xl px-4 py-3 text-xs text-ink-500">
          Porewise figures are planning estimates. Local codes, the equipment makers' ratings and licensed practice govern.
        </p>
      </footer>
    </div>
  );
}
