import { Archive, LogIn, LogOut, Pencil } from 'lucide-react';
import { useState, type ReactNode } from 'react';
import type { CartridgeDetailDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { PageHeader } from '@/components/ui/page-header';
import { BackLink } from '@/components/records/record-page';
import { Quantity } from '@/components/ui/quantity';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useCartridge } from '../api/get-cartridge';
import { useRemoveCartridge } from '../api/remove-cartridge';
import { CartridgeStatusBadge } from '@/components/status/cartridge-status-badge';
import { ArchiveToggleButton } from '@/components/records/archive-offer';
import { HistoryTimeline } from './history-timeline';
import { HousingCaution } from './housing-caution';
import { InstallDialog } from './install-dialog';
import { LifeGauge } from './life-gauge';
import { Measure } from './measure';
import { EditDetailsDialog } from './edit-details-dialog';
import { FilteredLots } from './filtered-lots';
import { RetireDialog } from './retire-dialog';
import { formatDate } from '@/lib/dates';

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-2 sm:block sm:border-0 sm:py-0">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="text-right text-base font-semibold text-ink-900 sm:text-left">{children}</dd>
    </div>
  );
}

function Facts({ c }: { c: CartridgeDetailDto }) {
  return (
    <Card title="Facts">
      <dl className="grid gap-x-6 sm:grid-cols-3 sm:gap-y-4 lg:grid-cols-4">
        <Fact label="Serial">{c.serial}</Fact>
        <Fact label="Batch">{c.batch || '—'}</Fact>
        <Fact label="Type">{c.typeName}</Fact>
        <Fact label="Rating">
          <Quantity value={c.ratingUm} unit="µm" /> <span className="font-normal text-ink-600">{c.typeKind}, {c.ratings.media}</span>
        </Fact>
        <Fact label="Length">
          <Quantity value={c.lengthIn} unit="in" /> <span className="font-normal text-ink-600">({c.elementEquivalents} × 10″)</span>
        </Fact>
        <Fact label="Status">
          <CartridgeStatusBadge status={c.status} size="md" />
        </Fact>
        <Fact label="Housing · round">{c.housingName ? `${c.housingName} · ${c.position ?? '—'}` : '—'}</Fact>
        <Fact label="Received">{c.receivedAt ? formatDate(c.receivedAt) : '—'}</Fact>
        <Fact label="Volume filtered">
          <Measure kind="volume" value={c.litresFiltered} />
        </Fact>
        <Fact label="Cycles">
          <span className="num">
            {c.steamCycles} steam · {c.hotWaterCycles} hot water · {c.chemicalCycles} chemical
          </span>
        </Fact>
        <Fact label="Temperature limit">
          <Measure kind="temperature" value={c.ratings.maxTempC} digits={0} />
        </Fact>
        {c.retiredReason ? <Fact label="Retired because">{c.retiredReason}</Fact> : null}
      </dl>
      {c.notes ? <p className="mt-3 text-sm text-ink-700">{c.notes}</p> : null}
    </Card>
  );
}

/** One cartridge: facts, actions, life forecast and history. A cellar screen: one column on a phone. */
export function CartridgePage({ id }: { id: string }) {
  const query = useCartridge(id);
  const mayMove = useCan('cartridges:move');
  const mayRetire = useCan('cartridges:register');
  const remove = useRemoveCartridge();
  const toast = useToast();
  const [dialog, setDialog] = useState<'install' | 'remove' | 'retire' | 'details' | null>(null);

  if (query.isPending) return <LoadingState />;
  if (query.isError) {
    const notFound = query.error instanceof ApiError && query.error.status === 404;
    return <ErrorState title={notFound ? 'No such cartridge' : undefined} message={notFound ? 'It may belong to another winery, or the link is wrong.' : query.error.message} onRetry={notFound ? undefined : () => query.refetch()} />;
  }
  const c = query.data;
  const canInstall = mayMove && c.status !== 'retired';
  const canRemove = mayMove && (c.status === 'installed' || c.status === 'regenerating');
  const canRetire = mayRetire && c.status !== 'retired';

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        context={
          <BackLink to={paths.cartridges} className="min-h-11">
            Cartridges
          </BackLink>
        }
        title={c.serial}
        description={`${c.lengthIn}-inch ${c.typeName}${c.batch ? `, batch ${c.batch}` : ''}`}
        actions={
          <>
            {canInstall ? (
              <Button size="lg" icon={<LogIn />} onClick={() => setDialog('install')}>
                {c.status === 'installed' ? 'Move…' : 'Install…'}
              </Button>
            ) : null}
            {canRemove ? (
              <Button size="lg" variant="secondary" icon={<LogOut />} onClick={() => setDialog('remove')}>
                Remove
              </Button>
            ) : null}
            {mayRetire ? (
              <Button size="lg" variant="secondary" icon={<Pencil />} onClick={() => setDialog('details')}>
                Edit details
              </Button>
            ) : null}
            {mayRetire ? <ArchiveToggleButton kind="cartridges" id={c.id} name={c.serial} archivedAt={c.archivedAt} /> : null}
            {canRetire ? (
              <Button size="lg" variant="secondary" icon={<Archive />} onClick={() => setDialog('retire')}>
                Retire…
              </Button>
            ) : null}
          </>
        }
      />
      <Facts c={c} />
      <LifeGauge life={c.life} lifeError={c.lifeError} />
      <FilteredLots id={c.id} serial={c.serial} />
      <HistoryTimeline events={c.events} />
      <InstallDialog cartridge={c} open={dialog === 'install'} onClose={() => setDialog(null)} />
      <RetireDialog cartridge={c} open={dialog === 'retire'} onClose={() => setDialog(null)} />
      <EditDetailsDialog cartridge={c} open={dialog === 'details'} onClose={() => setDialog(null)} />
      <ConfirmDialog
        open={dialog === 'remove'}
        onClose={() => setDialog(null)}
        title={`Remove ${c.serial}?`}
        description={c.housingName ? `From ${c.housingName}, round ${c.position}, back into stock.` : 'Back into stock.'}
        cancelLabel="Cancel"
        confirmLabel="Remove to stock"
        variant="primary"
        buttonSize="lg"
        pending={remove.isPending}
        onConfirm={() =>
          remove.mutate(c.id, {
            onSuccess: () => {
              toast.success('Removed', `${c.serial} is back in stock.`);
              setDialog(null);
            },
            onError: (e) => {
              toast.error('Not removed', errorMessage(e));
              setDialog(null);
            },
          })
        }
      >
        {c.housingName ? <HousingCaution /> : null}
      </ConfirmDialog>
    </div>
  );
}
