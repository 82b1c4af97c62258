import type { ReactNode } from 'react';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { AttachmentPanel } from '@/components/attachments/attachment-panel';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Quantity } from '@/components/ui/quantity';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useCartridgeType } from '../api/get-cartridge-type';
import { CartridgeTypeFigures } from './cartridge-type-figures';
import { Measured } from './measured';

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1.5">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="text-right text-ink-900">{children}</dd>
    </div>
  );
}

const count = (n: number | null) => (n === null ? <span className="text-ink-400">—</span> : <Quantity value={n} unit="cycles" digits={0} />);

/** A cartridge type's whole specification, its derived figures, its cartridges and its certificates. */
export function CartridgeTypeDetailsDialog({ typeId, onClose, onEdit }: { typeId: string | null; onClose: () => void; onEdit: (t: CartridgeTypeDto) => void }) {
  const query = useCartridgeType(typeId);
  const mayEdit = useCan('equipment:edit');
  const units = useUnits();
  const t = query.data;
  return (
    <Dialog
      open={typeId !== null}
      onClose={onClose}
      size="lg"
      title={t?.name ?? 'Cartridge type'}
      description={t ? `${t.kind === 'membrane' ? 'Membrane' : 'Prefilter'} · ${t.media} · ${t.ratingUm} µm · figures per 10-inch module` : undefined}
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Close
          </Button>
          {mayEdit && t ? <Button onClick={() => onEdit(t)}>Edit cartridge type</Button> : null}
        </>
      }
    >
      {query.isPending ? (
        <LoadingState />
      ) : query.isError ? (
        <ErrorState message={query.error.message} onRetry={() => query.refetch()} />
      ) : t ? (
        <div className="flex flex-col gap-5">
          {t.warnings.map((w) => (
            <p key={w.field} className="flex flex-wrap items-start gap-2 text-sm text-ink-800">
              <StatusBadge tone="watch" size="sm">
                check
              </StatusBadge>
              <span className="min-w-0 flex-1">{w.message}</span>
            </p>
          ))}
          <div className="grid gap-x-8 sm:grid-cols-2">
            <dl>
              <Item label="Filter area">
                <Measured formatted={units.format('area', t.areaM2Per10in)} />
              </Item>
              <Item label="Water flow">
                <Measured formatted={units.format('flow', t.waterFlowLhPer10in)} /> at <Measured formatted={units.format('dp', t.waterDpBar)} />
              </Item>
              <Item label="Design flow for wine">
                <Measured formatted={units.format('flow', t.designFluxLhPer10in)} />
              </Item>
              <Item label="Nominal capacity">
                {t.nominalCapacityLPerM2 === null ? <span className="text-sm text-ink-600">not given</span> : <Measured formatted={units.format('loading', t.nominalCapacityLPerM2)} />}
              </Item>
              <Item label="Maximum forward ΔP">
                <Measured formatted={units.format('dp', t.maxDpForwardBar)} />
              </Item>
              <Item label="Terminal ΔP">
                <Measured formatted={units.format('dp', t.terminalDpBar)} />
              </Item>
              <Item label="Maximum reverse ΔP">
                {t.maxDpReverseBar === null ? <span className="text-sm text-ink-600">not backwashable</span> : <Measured formatted={units.format('dp', t.maxDpReverseBar)} />}
              </Item>
              <Item label="Maximum temperature">
                <Measured formatted={units.format('temperature', t.maxTempC, 0)} />
              </Item>
            </dl>
            <dl>
              <Item label="Steam cycles">{count(t.ratedSteamCycles)}</Item>
              <Item label="Hot-water cycles">{count(t.ratedHotWaterCycles)}</Item>
              <Item label="Chemical cycles">{count(t.ratedChemicalCycles)}</Item>
              <Item label="Lowest flow recovery">
                <Quantity value={t.flowRecoveryMinPct} unit="%" digits={0} />
              </Item>
              <Item label="Minimum bubble point">
                <Measured formatted={units.format('pressure', t.bubblePointMinBar)} />
              </Item>
              <Item label="Diffusion limit">
                {t.diffusionMaxMlMinPer10in === null ? <span className="text-ink-400">—</span> : <Quantity value={t.diffusionMaxMlMinPer10in} unit="mL/min" />}
              </Item>
              <Item label="Price per 10-inch module">
                {t.pricePer10in === null ? <span className="text-ink-400">—</span> : <Quantity value={t.pricePer10in} unit={t.currency} digits={2} />}
              </Item>
            </dl>
          </div>
          <CartridgeTypeFigures
            figures={t.cleanWater ? { resistancePerM: t.cleanWater.resistancePerM, specTempC: t.cleanWater.specTempC, cleanWaterDpBarAtDesignFlux: t.cleanWater.dpBarAtDesignFlux } : null}
            spec={t}
          />
          <section aria-label="Cartridges of this type">
            <h3 className="mb-2 text-base font-semibold text-ink-900">Cartridges of this type</h3>
            <dl className="grid grid-cols-2 gap-2 sm:grid-cols-5">
              {(
                [
                  ['All', t.counts.total],
                  ['In stock', t.counts.inStock],
                  ['Installed', t.counts.installed],
                  ['Regenerating', t.counts.regenerating],
                  ['Retired', t.counts.retired],
                ] as const
              ).map(([label, n]) => (
                <div key={label} className="rounded border border-ink-200 px-3 py-2">
                  <dt className="text-sm text-ink-600">{label}</dt>
                  <dd className="num text-lg font-semibold text-ink-950">{n}</dd>
                </div>
              ))}
            </dl>
          </section>
          {t.notes ? <p className="text-sm whitespace-pre-line text-ink-700">{t.notes}</p> : null}
          <AttachmentPanel ownerKind="cartridge-type" ownerId={t.id} title="Certificates and data sheets" />
        </div>
      ) : null}
    </Dialog>
  );
}
