import { Archive, Droplets, Flame, FlaskConical, LogIn, LogOut, PackagePlus, ShieldCheck, ShieldX, StickyNote, Thermometer, Wine, type LucideIcon } from 'lucide-react';
import type { ReactNode } from 'react';
import type { CartridgeEventDto } from '@shared/types/cartridges';
import { Card } from '@/components/ui/card';
import { Quantity } from '@/components/ui/quantity';
import { StatusBadge } from '@/components/ui/status-badge';
import { Measure } from './measure';
import { formatDateTime } from '@/lib/dates';

const cycleWords: Record<string, { word: string; icon: LucideIcon }> = {
  steam: { word: 'Steam sterilisation', icon: Flame },
  'hot-water': { word: 'Hot-water sanitation', icon: Thermometer },
  chemical: { word: 'Chemical cleaning', icon: FlaskConical },
  backflush: { word: 'Backflush', icon: Droplets },
};

const n = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const where = (e: CartridgeEventDto) => (e.housingName ? `${e.housingName}${e.position ? `, round ${e.position}` : ''}` : null);

function describe(e: CartridgeEventDto): { icon: LucideIcon; title: ReactNode; body?: ReactNode } {
  const d = e.details;
  switch (e.kind) {
    case 'registered':
      return { icon: PackagePlus, title: d.source === 'import' ? 'Registered from a delivery import' : 'Registered', body: typeof d.batch === 'string' && d.batch ? `Batch ${d.batch}` : undefined };
    case 'installed':
      return { icon: LogIn, title: `Installed in ${where(e) ?? 'a housing'}` };
    case 'removed':
      return { icon: LogOut, title: where(e) ? `Removed from ${where(e)}` : d.from === 'regenerating' ? 'Back in stock after regeneration' : 'Removed to stock' };
    case 'retired':
      return { icon: Archive, title: 'Retired', body: typeof d.reason === 'string' ? d.reason : undefined };
    case 'run':
      return {
        icon: Wine,
        title: (
          <>
            Filtered <Measure kind="volume" value={n(d.litres)} />
            {where(e) ? ` in ${where(e)}` : ''}
          </>
        ),
      };
    case 'run-correction': {
      const before = n(d.litresBefore);
      const after = n(d.litresAfter);
      return {
        icon: Wine,
        title: (
          <>
            Litres of a run corrected{before !== null && after !== null ? ': ' : ''}
            {before !== null && after !== null ? (
              <>
                <Measure kind="volume" value={before} /> → <Measure kind="volume" value={after} />
              </>
            ) : null}
          </>
        ),
        body: [d.correction === 'void' ? 'A reading was voided after the run closed' : 'A reading was corrected after the run closed', typeof d.reason === 'string' && d.reason ? d.reason : null]
          .filter(Boolean)
          .join(': '),
      };
    }
    case 'cycle': {
      const c = cycleWords[String(d.kind)] ?? { word: 'Care cycle', icon: Droplets };
      const before = n(d.waterFlowBeforeLh);
      const after = n(d.waterFlowAfterLh);
      return {
        icon: c.icon,
        title: c.word,
        body: (
          <span className="flex flex-wrap gap-x-3">
            {n(d.tempC) !== null ? <Measure kind="temperature" value={n(d.tempC)} digits={0} /> : null}
            {n(d.durationMin) !== null ? <Quantity value={n(d.durationMin) as number} unit="min" /> : null}
            {typeof d.agent === 'string' ? <span>{d.agent}</span> : null}
            {after !== null ? (
              <span>
                water flow {before !== null ? <Measure kind="flow" value={before} /> : '—'} → <Measure kind="flow" value={after} />
                {n(d.flowDpBar) !== null ? (
                  <>
                    {' '}
                    at <Measure kind="dp" value={n(d.flowDpBar)} />
                  </>
                ) : null}
              </span>
            ) : null}
          </span>
        ),
      };
    }
    case 'integrity':
      return {
        icon: d.pass ? ShieldCheck : ShieldX,
        title: (
          <span className="inline-flex flex-wrap items-center gap-2">
            Integrity test{typeof d.method === 'string' ? ` (${d.method})` : ''}
            <StatusBadge tone={d.pass ? 'ok' : 'stop'} size="sm">
              {d.pass ? 'passed' : 'failed'}
            </StatusBadge>
          </span>
        ),
        body: typeof d.note === 'string' ? d.note : undefined,
      };
    default:
      return {
        icon: StickyNote,
        title: Array.isArray(d.edited) ? `Edited ${(d.edited as string[]).join(', ')}` : 'Note',
        body: typeof d.text === 'string' ? d.text : undefined,
      };
  }
}

/** Who did what and when, newest first. */
export function HistoryTimeline({ events }: { events: CartridgeEventDto[] }) {
  return (
    <Card title="History" description="Every move and every piece of care, newest first.">
      {events.length === 0 ? (
        <p className="text-base text-ink-600">Nothing recorded yet.</p>
      ) : (
        <ol className="relative flex flex-col gap-4 border-l border-ink-200 pl-5" aria-label="History">
          {events.map((e) => {
            const { icon: Icon, title, body } = describe(e);
            return (
              <li key={e.id} className="relative">
                <span aria-hidden="true" className="absolute top-0.5 -left-[1.95rem] inline-flex size-6 items-center justify-center rounded-full border border-ink-300 bg-white text-ink-700">
                  <Icon className="size-3.5" />
                </span>
                <p className="text-base font-semibold text-ink-900">{title}</p>
                {body ? <div className="text-sm text-ink-700">{body}</div> : null}
                <p className="text-sm text-ink-600">
                  <time dateTime={e.at}>{formatDateTime(e.at)}</time> · {e.actorName ?? 'former member'}
                </p>
              </li>
            );
          })}
        </ol>
      )}
    </Card>
  );
}
