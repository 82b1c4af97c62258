import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { housingAreaM2, housingElementEquivalents } from '@shared/adapters/equipment';
import { createHousingInputSchema, HOUSING_LENGTHS_IN } from '@shared/schemas/equipment';
import type { HousingDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { CautionPanel } from '@/components/ui/caution';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCartridgeTypes } from '../api/get-cartridge-types';
import { useCreateHousing } from '../api/create-housing';
import { useUpdateHousing } from '../api/update-housing';
import { bodyResolver, parseTyped, typedNumber, typedOptionalQuantity, typedQuantity } from '../utils/typed-input';
import { DerivedFigure, quantityParts } from './derived-figure';

type HousingForm = {
  name: string;
  rounds: string;
  lengthIn: string;
  maxPressureBar: string;
  maxTempC: string;
  holdUpL: string;
  upstreamGasVolumeL: string;
  notes: string;
};
const fieldNames = ['name', 'rounds', 'lengthIn', 'maxPressureBar', 'maxTempC', 'holdUpL', 'upstreamGasVolumeL', 'notes'] as const;

/** Add or change a housing; the 10-inch equivalents and the area follow the fields as they are typed. */
export function HousingFormDialog({ open, housing, onClose }: { open: boolean; housing: HousingDto | null; onClose: () => void }) {
  return open ? <HousingFormBody housing={housing} onClose={onClose} /> : null;
}

function HousingFormBody({ housing, onClose }: { housing: HousingDto | null; onClose: () => void }) {
  const units = useUnits();
  const toast = useToast();
  const create = useCreateHousing();
  const update = useUpdateHousing();
  const [areaTypeId, setAreaTypeId] = useState('');
  const types = useCartridgeTypes({ sort: 'name', order: 'asc', page: 1, pageSize: 100 });

  const { fromInput, toInput } = units;
  const toBody = (f: HousingForm) => ({
    name: f.name,
    rounds: typedNumber(f.rounds),
    lengthIn: typedNumber(f.lengthIn),
    maxPressureBar: typedQuantity(fromInput, 'pressure', f.maxPressureBar),
    maxTempC: typedQuantity(fromInput, 'temperature', f.maxTempC),
    holdUpL: typedQuantity(fromInput, 'volume', f.holdUpL),
    upstreamGasVolumeL: typedOptionalQuantity(fromInput, 'volume', f.upstreamGasVolumeL),
    notes: f.notes,
  });
  const resolver = useMemo(() => bodyResolver(createHousingInputSchema, toBody), [units.system]);
  const form = useForm<HousingForm, unknown, ReturnType<typeof createHousingInputSchema.parse>>({
    resolver,
    defaultValues: {
      name: housing?.name ?? '',
      rounds: housing ? String(housing.rounds) : '',
      lengthIn: String(housing?.lengthIn ?? 30),
      maxPressureBar: toInput('pressure', housing?.maxPressureBar),
      maxTempC: toInput('temperature', housing?.maxTempC, 1),
      holdUpL: toInput('volume', housing?.holdUpL, 2),
      upstreamGasVolumeL: toInput('volume', housing?.upstreamGasVolumeL, 2),
      notes: housing?.notes ?? '',
    },
  });
  const { errors } = form.formState;
  const rounds = form.watch('rounds');
  const lengthIn = form.watch('lengthIn');

  const roundsN = parseTyped(rounds);
  const lengthN = Number(lengthIn);
  const equivalents = roundsN === undefined ? null : housingElementEquivalents({ rounds: roundsN, lengthIn: lengthN });
  const areaType = types.data?.items.find((t) => t.id === areaTypeId) ?? null;
  const area = equivalents !== null && areaType ? housingAreaM2(equivalents, areaType.areaM2Per10in) : null;

  const { alert, submit } = useFormSubmit(form, {
    fields: fieldNames,
    save: async (body) => {
      if (housing) await update.mutateAsync({ id: housing.id, changes: body });
      else await create.mutateAsync(body);
      toast.success(housing ? 'Housing saved' : 'Housing added', body.name);
      onClose();
    },
  });

  return (
    <Dialog
      open
      onClose={onClose}
      size="lg"
      title={housing ? `Edit ${housing.name}` : 'Add a housing'}
      description="The housing's rounds, cartridge length and the maker's ratings from its plate or data sheet."
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form="housing-form" loading={create.isPending || update.isPending}>
            {housing ? 'Save housing' : 'Add housing'}
          </Button>
        </>
      }
    >
      <form id="housing-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="Name" htmlFor="housing-name" error={errors.name?.message} required>
          <Input id="housing-name" autoComplete="off" data-autofocus {...form.register('name')} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Rounds" htmlFor="housing-rounds" hint="Cartridge positions in the housing." error={errors.rounds?.message} required>
            <NumberInput id="housing-rounds" {...form.register('rounds')} />
          </FormField>
          <FormField label="Cartridge length" htmlFor="housing-length" error={errors.lengthIn?.message} required>
            <Select id="housing-length" options={HOUSING_LENGTHS_IN.map((l) => ({ value: String(l), label: `${l}-inch` }))} {...form.register('lengthIn')} />
          </FormField>
          <FormField label="Maximum working pressure" htmlFor="housing-pressure" error={errors.maxPressureBar?.message} required>
            <NumberInput id="housing-pressure" unit={units.symbol('pressure')} {...form.register('maxPressureBar')} />
          </FormField>
          <FormField label="Maximum temperature" htmlFor="housing-temp" error={errors.maxTempC?.message} required>
            <NumberInput id="housing-temp" unit={units.symbol('temperature')} {...form.register('maxTempC')} />
          </FormField>
          <FormField label="Hold-up volume" htmlFor="housing-holdup" hint="Wine left in the housing at the end of a run." error={errors.holdUpL?.message} required>
            <NumberInput id="housing-holdup" unit={units.symbol('volume')} {...form.register('holdUpL')} />
          </FormField>
          <FormField
            label="Upstream gas volume"
            htmlFor="housing-gas"
            hint="Gas space upstream of the cartridges during a pressure-hold test. Leave empty if unknown."
            error={errors.upstreamGasVolumeL?.message}
          >
            <NumberInput id="housing-gas" unit={units.symbol('volume')} {...form.register('upstreamGasVolumeL')} />
          </FormField>
        </div>

        <div className="grid gap-2 sm:grid-cols-2" aria-live="polite">
          <DerivedFigure
            data-testid="housing-equivalents"
            label="10-inch equivalents"
            value={equivalents === null ? null : String(equivalents)}
            missing="Enter the rounds and choose the cartridge length."
            how={`${roundsN} rounds × ${lengthN} in ÷ 10 in per module = ${equivalents}. Each 10-inch module counts once in train sizing.`}
          />
          <div className="flex flex-col gap-2">
            <DerivedFigure
              label={areaType ? `Area with ${areaType.name}` : 'Filter area'}
              {...quantityParts(area === null ? null : units.format('area', area))}
              missing={equivalents === null ? 'Enter the rounds first.' : 'Choose a cartridge type below to see the area.'}
              how={
                areaType && equivalents !== null
                  ? `${equivalents} equivalents × ${units.format('area', areaType.areaM2Per10in)} per 10-inch module of ${areaType.name}.`
                  : ''
              }
            />
            <Select
              aria-label="Cartridge type for the area"
              placeholder={types.data?.items.length ? 'Area with cartridge type …' : 'No cartridge types yet'}
              options={(types.data?.items ?? []).map((t) => ({ value: t.id, label: t.name }))}
              value={areaTypeId}
              disabled={!types.data?.items.length}
              onChange={(e) => setAreaTypeId(e.target.value)}
            />
          </div>
        </div>

        <FormField label="Notes" htmlFor="housing-notes" error={errors.notes?.message}>
          <Textarea id="housing-notes" rows={2} {...form.register('notes')} />
        </FormField>

        <CautionPanel title="Never open a housing under pressure">
          <ul>
            <li>Vent and drain the housing before loosening the clamp or bell; hot water and steam stay under pressure.</li>
            <li>Keep within the lower of the housing's and the cartridges' pressure and temperature ratings.</li>
            <li>Figures here are planning estimates; the makers' ratings, local codes and licensed practice govern.</li>
          </ul>
        </CautionPanel>
      </form>
    </Dialog>
  );
}
