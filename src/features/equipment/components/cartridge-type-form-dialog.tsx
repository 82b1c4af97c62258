import { useMemo, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { cartridgeTypeFigures } from '@shared/adapters/equipment';
import {
  cartridgeKinds,
  cartridgeMedia,
  cartridgeTypeWarnings,
  createCartridgeTypeInputSchema,
  type CartridgeKind,
} from '@shared/schemas/equipment';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { CautionPanel } from '@/components/ui/caution';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCreateCartridgeType } from '../api/create-cartridge-type';
import { useUpdateCartridgeType } from '../api/update-cartridge-type';
import { bodyResolver, inputText, typedNumber, typedOptionalNumber, typedOptionalQuantity, typedQuantity } from '../utils/typed-input';
import { CartridgeTypeFigures } from './cartridge-type-figures';

type TypeForm = {
  name: string;
  kind: string;
  media: string;
  ratingUm: string;
  areaM2Per10in: string;
  waterFlowLhPer10in: string;
  waterDpBar: string;
  designFluxLhPer10in: string;
  nominalCapacityLPerM2: string;
  maxDpForwardBar: string;
  maxDpReverseBar: string;
  terminalDpBar: string;
  maxTempC: string;
  ratedSteamCycles: string;
  ratedHotWaterCycles: string;
  ratedChemicalCycles: string;
  flowRecoveryMinPct: string;
  bubblePointMinBar: string;
  diffusionMaxMlMinPer10in: string;
  pricePer10in: string;
  currency: string;
  notes: string;
};
const fieldNames = [
  'name',
  'kind',
  'media',
  'ratingUm',
  'areaM2Per10in',
  'waterFlowLhPer10in',
  'waterDpBar',
  'designFluxLhPer10in',
  'nominalCapacityLPerM2',
  'maxDpForwardBar',
  'maxDpReverseBar',
  'terminalDpBar',
  'maxTempC',
  'ratedSteamCycles',
  'ratedHotWaterCycles',
  'ratedChemicalCycles',
  'flowRecoveryMinPct',
  'bubblePointMinBar',
  'diffusionMaxMlMinPer10in',
  'pricePer10in',
  'currency',
  'notes',
] as const;

const mediaLabels: Record<(typeof cartridgeMedia)[number], string> = {
  polypropylene: 'Polypropylene',
  'glass fibre': 'Glass fibre',
  PES: 'PES',
  PVDF: 'PVDF',
  nylon: 'Nylon',
  other: 'Other',
};

function Group({ legend, hint, children }: { legend: string; hint?: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-3 border-t border-ink-200 pt-3">
      <legend className="pr-2 text-base font-semibold text-ink-900">{legend}</legend>
      {hint ? <p className="-mt-2 text-sm text-ink-600">{hint}</p> : null}
      <div className="grid gap-4 sm:grid-cols-2">{children}</div>
    </fieldset>
  );
}

/** Add or change a cartridge type of the winery's catalogue, with the clean-water figures computed as it is typed. */
export function CartridgeTypeFormDialog({ open, type, onClose }: { open: boolean; type: CartridgeTypeDto | null; onClose: () => void }) {
  return open ? <CartridgeTypeFormBody type={type} onClose={onClose} /> : null;
}

function CartridgeTypeFormBody({ type, onClose }: { type: CartridgeTypeDto | null; onClose: () => void }) {
  const units = useUnits();
  const toast = useToast();
  const create = useCreateCartridgeType();
  const update = useUpdateCartridgeType();
  const { fromInput, toInput, symbol } = units;
  // The nominal capacity as first shown; left as shown, its stored value is sent back exactly
  // (no rounding back from gal/ft²).
  const nominalShown = toInput('loading', type?.nominalCapacityLPerM2, 2);

  const toBody = (f: TypeForm) => ({
    name: f.name,
    kind: f.kind,
    media: f.media,
    ratingUm: typedNumber(f.ratingUm),
    areaM2Per10in: typedQuantity(fromInput, 'area', f.areaM2Per10in),
    waterFlowLhPer10in: typedQuantity(fromInput, 'flow', f.waterFlowLhPer10in),
    waterDpBar: typedQuantity(fromInput, 'dp', f.waterDpBar),
    designFluxLhPer10in: typedQuantity(fromInput, 'flow', f.designFluxLhPer10in),
    nominalCapacityLPerM2:
      type && f.nominalCapacityLPerM2 === nominalShown ? type.nominalCapacityLPerM2 : typedOptionalQuantity(fromInput, 'loading', f.nominalCapacityLPerM2),
    maxDpForwardBar: typedQuantity(fromInput, 'dp', f.maxDpForwardBar),
    maxDpReverseBar: typedOptionalQuantity(fromInput, 'dp', f.maxDpReverseBar),
    terminalDpBar: typedQuantity(fromInput, 'dp', f.terminalDpBar),
    maxTempC: typedQuantity(fromInput, 'temperature', f.maxTempC),
    ratedSteamCycles: typedOptionalNumber(f.ratedSteamCycles),
    ratedHotWaterCycles: typedOptionalNumber(f.ratedHotWaterCycles),
    ratedChemicalCycles: typedOptionalNumber(f.ratedChemicalCycles),
    flowRecoveryMinPct: typedNumber(f.flowRecoveryMinPct),
    bubblePointMinBar: typedOptionalQuantity(fromInput, 'pressure', f.bubblePointMinBar),
    diffusionMaxMlMinPer10in: typedOptionalNumber(f.diffusionMaxMlMinPer10in),
    pricePer10in: typedOptionalNumber(f.pricePer10in),
    currency: f.currency,
    notes: f.notes,
  });
  const resolver = useMemo(() => bodyResolver(createCartridgeTypeInputSchema, toBody), [units.system]);
  const form = useForm<TypeForm, unknown, ReturnType<typeof createCartridgeTypeInputSchema.parse>>({
    resolver,
    defaultValues: {
      name: type?.name ?? '',
      kind: type?.kind ?? 'prefilter',
      media: type?.media ?? 'polypropylene',
      ratingUm: inputText(type?.ratingUm),
      areaM2Per10in: toInput('area', type?.areaM2Per10in, 3),
      waterFlowLhPer10in: toInput('flow', type?.waterFlowLhPer10in, 1),
      waterDpBar: toInput('dp', type?.waterDpBar),
      designFluxLhPer10in: toInput('flow', type?.designFluxLhPer10in, 1),
      nominalCapacityLPerM2: nominalShown,
      maxDpForwardBar: toInput('dp', type?.maxDpForwardBar, 3),
      maxDpReverseBar: toInput('dp', type?.maxDpReverseBar, 3),
      terminalDpBar: toInput('dp', type?.terminalDpBar, 3),
      maxTempC: toInput('temperature', type?.maxTempC, 1),
      ratedSteamCycles: inputText(type?.ratedSteamCycles),
      ratedHotWaterCycles: inputText(type?.ratedHotWaterCycles),
      ratedChemicalCycles: inputText(type?.ratedChemicalCycles),
      flowRecoveryMinPct: inputText(type?.flowRecoveryMinPct ?? 70),
      bubblePointMinBar: toInput('pressure', type?.bubblePointMinBar, 3),
      diffusionMaxMlMinPer10in: inputText(type?.diffusionMaxMlMinPer10in),
      pricePer10in: inputText(type?.pricePer10in),
      currency: type?.currency ?? 'EUR',
      notes: type?.notes ?? '',
    },
  });
  const { errors } = form.formState;
  const values = form.watch();
  const live = toBody(values);
  const spec = {
    waterFlowLhPer10in: live.waterFlowLhPer10in ?? Number.NaN,
    waterDpBar: live.waterDpBar ?? Number.NaN,
    areaM2Per10in: live.areaM2Per10in ?? Number.NaN,
    designFluxLhPer10in: live.designFluxLhPer10in ?? null,
  };
  const figures = cartridgeTypeFigures(spec);
  const warnings = cartridgeTypeWarnings({
    kind: values.kind as CartridgeKind,
    bubblePointMinBar: live.bubblePointMinBar,
    diffusionMaxMlMinPer10in: live.diffusionMaxMlMinPer10in,
  });

  const { alert, submit } = useFormSubmit(form, {
    fields: fieldNames,
    save: async (body) => {
      if (type) await update.mutateAsync({ id: type.id, changes: body });
      else await create.mutateAsync(body);
      toast.success(type ? 'Cartridge type saved' : 'Cartridge type added', body.name);
      onClose();
    },
  });

  const field = (name: (typeof fieldNames)[number], label: string, unit: string, opts: { hint?: string; required?: boolean } = {}) => (
    <FormField label={label} htmlFor={`type-${name}`} hint={opts.hint} error={errors[name]?.message} required={opts.required}>
      <NumberInput id={`type-${name}`} unit={unit} {...form.register(name)} />
    </FormField>
  );

  return (
    <Dialog
      open
      onClose={onClose}
      size="lg"
      title={type ? `Edit ${type.name}` : 'Add a cartridge type'}
      description="Figures per 10-inch module, from the maker's data sheet. A 30-inch cartridge counts as three modules."
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form="type-form" loading={create.isPending || update.isPending}>
            {type ? 'Save cartridge type' : 'Add cartridge type'}
          </Button>
        </>
      }
    >
      <form id="type-form" onSubmit={submit} noValidate className="flex flex-col gap-5">
        <FormMessage message={alert} />
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Name" htmlFor="type-name" error={errors.name?.message} required className="sm:col-span-2">
            <Input id="type-name" autoComplete="off" data-autofocus {...form.register('name')} />
          </FormField>
          <FormField label="Kind" htmlFor="type-kind" error={errors.kind?.message} required>
            <Select id="type-kind" options={cartridgeKinds.map((k) => ({ value: k, label: k === 'prefilter' ? 'Prefilter' : 'Membrane' }))} {...form.register('kind')} />
          </FormField>
          <FormField label="Media" htmlFor="type-media" error={errors.media?.message} required>
            <Select id="type-media" options={cartridgeMedia.map((m) => ({ value: m, label: mediaLabels[m] }))} {...form.register('media')} />
          </FormField>
          {field('ratingUm', 'Micron rating', 'µm', { required: true })}
        </div>

        <Group legend="Clean-water specification" hint="The water flow and ΔP the maker gives for one 10-inch module, at 20 °C.">
          {field('areaM2Per10in', 'Filter area', symbol('area'), { required: true })}
          {field('waterFlowLhPer10in', 'Water flow', symbol('flow'), { required: true })}
          {field('waterDpBar', 'ΔP at that flow', symbol('dp'), { required: true })}
          {field('designFluxLhPer10in', 'Design flow for wine', symbol('flow'), { required: true, hint: 'The flow per module you plan to run.' })}
        </Group>

        <CartridgeTypeFigures figures={figures} spec={spec} />

        <Group legend="Capacity for planning">
          {field('nominalCapacityLPerM2', 'Nominal capacity to terminal ΔP', symbol('loading'), {
            hint: 'The maker’s or your winery’s usual figure for an average wine. Plans use it when the lot has no Vmax test and no similar past runs. Leave empty when you have none.',
          })}
        </Group>

        <Group legend="Limits">
          {field('maxDpForwardBar', 'Maximum forward ΔP', symbol('dp'), { required: true })}
          {field('terminalDpBar', 'Terminal ΔP', symbol('dp'), { required: true, hint: 'Regenerate or change the set at this ΔP.' })}
          {field('maxDpReverseBar', 'Maximum reverse ΔP', symbol('dp'), { hint: 'Leave empty when it may not be backwashed.' })}
          {field('maxTempC', 'Maximum temperature', symbol('temperature'), { required: true })}
        </Group>

        <Group legend="Rated life" hint="Leave a count empty when the maker gives none.">
          {field('ratedSteamCycles', 'Steam cycles', 'cycles')}
          {field('ratedHotWaterCycles', 'Hot-water cycles', 'cycles')}
          {field('ratedChemicalCycles', 'Chemical cycles', 'cycles')}
          {field('flowRecoveryMinPct', 'Lowest water-flow recovery', '%', { hint: 'Retire it when a regeneration recovers less.' })}
        </Group>

        <Group legend="Integrity-test limits" hint="For membranes: the maker's minimum bubble point and the diffusion limit per 10-inch module.">
          {field('bubblePointMinBar', 'Minimum bubble point', symbol('pressure'))}
          {field('diffusionMaxMlMinPer10in', 'Diffusion limit', 'mL/min')}
          {warnings.length ? (
            <div className="flex flex-col gap-1 sm:col-span-2" role="status">
              {warnings.map((w) => (
                <p key={w.field} className="flex flex-wrap items-start gap-2 text-sm text-ink-800">
                  <StatusBadge tone="watch" size="sm">
                    check
                  </StatusBadge>
                  <span className="min-w-0 flex-1">{w.message} You may save it as it is.</span>
                </p>
              ))}
            </div>
          ) : null}
        </Group>

        <Group legend="Price">
          {field('pricePer10in', 'Price per 10-inch module', values.currency || '')}
          <FormField label="Currency" htmlFor="type-currency" error={errors.currency?.message}>
            <Input id="type-currency" maxLength={3} autoComplete="off" className="uppercase" {...form.register('currency')} />
          </FormField>
        </Group>

        <FormField label="Notes" htmlFor="type-notes" error={errors.notes?.message}>
          <Textarea id="type-notes" rows={2} {...form.register('notes')} />
        </FormField>

        <CautionPanel title="Respect the cartridge's ratings">
          Keep within the lower of the cartridge's and the housing's pressure and temperature ratings, including during steaming and
          backwashing. The figures here are planning estimates; the maker's data sheet and licensed practice govern.
        </CautionPanel>
      </form>
    </Dialog>
  );
}
