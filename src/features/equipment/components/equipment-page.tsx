import { useId, type KeyboardEvent } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { cn } from '@/utils/cn';
import { CartridgeTypesSection } from './cartridge-types-section';
import { HousingsSection } from './housings-section';
import { LinesSection } from './lines-section';

const tabs = [
  { id: 'housings', label: 'Housings', Section: HousingsSection },
  { id: 'lines', label: 'Bottling lines', Section: LinesSection },
  { id: 'cartridge-types', label: 'Cartridge types', Section: CartridgeTypesSection },
] as const;
type TabId = (typeof tabs)[number]['id'];

/** Housings, bottling lines and the winery's cartridge-type catalogue, one tab each (the tab is kept in the URL). */
export function EquipmentPage() {
  const [search, setSearch] = useSearchParams();
  const baseId = useId();
  const current: TabId = tabs.some((t) => t.id === search.get('tab')) ? (search.get('tab') as TabId) : 'housings';
  const select = (id: TabId) => setSearch(id === 'housings' ? {} : { tab: id }, { replace: true });
  const active = tabs.find((t) => t.id === current)!;

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const i = tabs.findIndex((t) => t.id === current);
    const next = event.key === 'ArrowRight' ? (i + 1) % tabs.length : event.key === 'ArrowLeft' ? (i + tabs.length - 1) % tabs.length : -1;
    if (next < 0) return;
    event.preventDefault();
    select(tabs[next].id);
    document.getElementById(`${baseId}-tab-${tabs[next].id}`)?.focus();
  };

  return (
    <div className="flex flex-col gap-4">
      <PageHeader title="Equipment" description="The housings of your filter train, the bottling line and the cartridge types you buy. Plans and cartridges build on them." />
      <div role="tablist" aria-label="Equipment" onKeyDown={onKeyDown} className="-mb-px flex gap-1 overflow-x-auto border-b border-ink-200">
        {tabs.map((t) => {
          const selected = t.id === current;
          return (
            <button
              key={t.id}
              id={`${baseId}-tab-${t.id}`}
              type="button"
              role="tab"
              aria-selected={selected}
              aria-controls={`${baseId}-panel`}
              tabIndex={selected ? 0 : -1}
              onClick={() => select(t.id)}
              className={cn(
                'min-h-11 shrink-0 border-b-2 px-3 text-base font-semibold whitespace-nowrap',
                selected ? 'border-primary-600 text-primary-800' : 'border-transparent text-ink-600 hover:border-ink-300 hover:text-ink-900',
              )}
            >
              {t.label}
            </button>
          );
        })}
      </div>
      <div id={`${baseId}-panel`} role="tabpanel" aria-labelledby={`${baseId}-tab-${current}`}>
        <active.Section key={active.id} />
      </div>
    </div>
  );
}
