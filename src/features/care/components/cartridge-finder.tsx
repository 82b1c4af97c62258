import { Search } from 'lucide-react';
import { useId, useState } from 'react';
import type { CartridgeDto } from '@shared/types/cartridges';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { errorMessage } from '@/lib/api-client';
import { useFindCartridges } from '../api/find-cartridges';

const statusWords: Record<string, { word: string; tone: StatusTone }> = {
  'in-stock': { word: 'in stock', tone: 'neutral' },
  installed: { word: 'installed', tone: 'ok' },
  regenerating: { word: 'regenerating', tone: 'info' },
  retired: { word: 'retired', tone: 'stop' },
};

export function CartridgeStatus({ status }: { status: string }) {
  const s = statusWords[status] ?? { word: status, tone: 'neutral' as const };
  return (
    <StatusBadge tone={s.tone} size="sm">
      {s.word}
    </StatusBadge>
  );
}

/** Type-ahead over the inventory by serial (or batch). */
export function CartridgeFinder({ onPick }: { onPick: (c: CartridgeDto) => void }) {
  const id = useId();
  const [q, setQ] = useState('');
  const found = useFindCartridges(q);
  const term = q.trim();
  const items = term.length >= 2 ? (found.data?.items ?? []) : [];
  return (
    <div className="flex flex-col gap-2">
      <FormField label="Cartridge serial" htmlFor={id} hint="Type at least two characters of the serial or the batch.">
        <div className="relative">
          <Search aria-hidden="true" className="pointer-events-none absolute top-1/2 left-3 size-5 -translate-y-1/2 text-ink-500" />
          <Input
            id={id}
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="e.g. PES45-0003"
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            className="pl-10"
            aria-controls={`${id}-results`}
          />
        </div>
      </FormField>
      <div id={`${id}-results`} aria-live="polite">
        {found.isError ? <p className="text-sm text-stop-700">{errorMessage(found.error)}</p> : null}
        {term.length >= 2 && found.isSuccess && items.length === 0 ? (
          <p className="text-base text-ink-700">No cartridge matches “{term}”. Check the serial on the cartridge end cap.</p>
        ) : null}
        {items.length ? (
          <ul className="flex flex-col divide-y divide-ink-100 rounded border border-ink-200 bg-white" aria-label="Matching cartridges">
            {items.map((c) => (
              <li key={c.id}>
                <button
                  type="button"
                  onClick={() => {
                    onPick(c);
                    setQ('');
                  }}
                  className="flex min-h-touch w-full flex-wrap items-center justify-between gap-x-3 gap-y-1 px-3 py-2 text-left hover:bg-primary-50 focus-visible:bg-primary-50"
                >
                  <span className="min-w-0">
                    <span className="num block text-base font-semibold text-ink-950">{c.serial}</span>
                    <span className="block text-sm text-ink-600">
                      {c.typeName} · {c.lengthIn}″{c.housingName ? ` · ${c.housingName}${c.position ? ` round ${c.position}` : ''}` : ''}
                    </span>
                  </span>
                  <CartridgeStatus status={c.status} />
                </button>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </div>
  );
}
