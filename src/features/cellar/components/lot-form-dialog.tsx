import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { z } from 'zod';
import { WINE_STYLES } from '@shared/engine';
import { lotInputSchema, wineStyleLabels } from '@shared/schemas/cellar';
import type { LotDto } from '@shared/types/cellar';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCreateLot } from '../api/create-lot';
import { useTanks } from '../api/get-tanks';
import { useUpdateLot } from '../api/update-lot';
import { decimalText, numberText, requestSchema, toMetricOrKeep } from './form-values';

const fields = ['code', 'name', 'style', 'vintage', 'volumeL', 'tankId', 'ethanolPctVol', 'sugarGPerL', 'tempC', 'notes'] as const;

/** Adds a lot (then opens its page), or edits one when `lot` is given. Volume and temperature in the person's units. */
export function LotFormDialog({ open, onClose, lot }: { open: boolean; onClose: () => void; lot?: LotDto | null }) {
  const units = useUnits();
  const tanks = useTanks({ pageSize: 100, sort: 'name' });
  const create = useCreateLot();
  const update = useUpdateLot();
  const toast = useToast();
  const navigate = useNavigate();

  const schema = useMemo(
    () =>
      z
        .object({
          code: z.string(),
          name: z.string(),
          style: z.string(),
          vintage: decimalText,
          volumeL: decimalText,
          tankId: z.string().transform((v) => (v === '' ? null : v)),
          ethanolPctVol: decimalText,
          sugarGPerL: decimalText,
          tempC: decimalText,
          notes: z.string(),
        })
        .transform((v) => ({
          ...v,
          volumeL: toMetricOrKeep(units.fromInput, 'volume', v.volumeL),
          tempC: toMetricOrKeep(units.fromInput, 'temperature', v.tempC),
          sugarGPerL: v.sugarGPerL ?? 0,
        }))
        .pipe(requestSchema(lotInputSchema)),
    // Rebuilt only when the person's unit system changes.
    [units.system],
  );
  const form = useForm({
    resolver: zodResolver(schema),
    values: {
      code: lot?.code ?? '',
      name: lot?.name ?? '',
      style: lot?.style ?? 'white',
      vintage: numberText(lot?.vintage),
      volumeL: lot ? units.toInput('volume', lot.volumeL, 1) : '',
      tankId: lot?.tank?.id ?? '',
      ethanolPctVol: numberText(lot?.ethanolPctVol),
      sugarGPerL: numberText(lot?.sugarGPerL),
      tempC: lot ? units.toInput('temperature', lot.tempC, 1) : '',
      notes: lot?.notes ?? '',
    },
  });
  const { errors } = form.formState;

  const { alert, submit, close } = useFormSubmit(form, {
    fields,
    onClose,
    save: async (input, close) => {
      if (lot) {
        // A figure shown in the person's units and not touched keeps its stored value exactly
        // (a US-units round trip must never rewrite 3800 L as 3800.17 L).
        const dirty = form.formState.dirtyFields;
        const kept = { ...input, ...(dirty.volumeL ? {} : { volumeL: lot.volumeL }), ...(dirty.tempC ? {} : { tempC: lot.tempC }) };
        await update.mutateAsync({ id: lot.id, input: kept });
        toast.success('Lot saved', `${input.code} · ${input.name}`);
        close();
      } else {
        const created = await create.mutateAsync(input);
        toast.success('Lot added', `${created.code} · ${created.name}. Add its first lab result to see its readiness.`);
        close();
        navigate(paths.lot(created.id));
      }
    },
  });

  const tankOptions = (tanks.data?.items ?? []).map((t) => ({ value: t.id, label: t.name }));

  return (
    <Dialog
      open={open}
      onClose={close}
      size="lg"
      title={lot ? `Edit ${lot.code}` : 'Add lot'}
      description="A wine lot to be filtered and bottled. Lab results are added on the lot's page."
      footer={
        <>
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" form="lot-form" loading={create.isPending || update.isPending}>
            {lot ? 'Save lot' : 'Add lot'}
          </Button>
        </>
      }
    >
      <form id="lot-form" onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
        {alert ? (
          <p role="alert" className="text-sm font-semibold text-stop-700 sm:col-span-2">
            {alert}
          </p>
        ) : null}
        <FormField label="Lot code" htmlFor="lot-code" hint="Unique in this winery, e.g. 24-SB-01." error={errors.code?.message} required>
          <Input id="lot-code" autoComplete="off" data-autofocus {...form.register('code')} />
        </FormField>
        <FormField label="Name" htmlFor="lot-name" error={errors.name?.message} required>
          <Input id="lot-name" autoComplete="off" {...form.register('name')} />
        </FormField>
        <FormField label="Style" htmlFor="lot-style" hint="Sets the turbidity limit used for readiness." error={errors.style?.message} required>
          <Select id="lot-style" options={WINE_STYLES.map((s) => ({ value: s, label: wineStyleLabels[s] }))} {...form.register('style')} />
        </FormField>
        <FormField label="Vintage" htmlFor="lot-vintage" hint="Leave empty for a non-vintage blend." error={errors.vintage?.message}>
          <NumberInput id="lot-vintage" {...form.register('vintage')} />
        </FormField>
        <FormField label="Volume" htmlFor="lot-volume" error={errors.volumeL?.message} required>
          <NumberInput id="lot-volume" unit={units.symbol('volume')} {...form.register('volumeL')} />
        </FormField>
        <FormField
          label="Tank"
          htmlFor="lot-tank"
          hint={tankOptions.length === 0 && !tanks.isPending ? 'No tanks yet: add tanks on the Cellar page.' : undefined}
          error={errors.tankId?.message}
        >
          <Select id="lot-tank" placeholder="No tank" options={tankOptions} {...form.register('tankId')} />
        </FormField>
        <FormField label="Alcohol" htmlFor="lot-ethanol" error={errors.ethanolPctVol?.message} required>
          <NumberInput id="lot-ethanol" unit="% vol" {...form.register('ethanolPctVol')} />
        </FormField>
        <FormField label="Residual sugar" htmlFor="lot-sugar" error={errors.sugarGPerL?.message}>
          <NumberInput id="lot-sugar" unit="g/L" {...form.register('sugarGPerL')} />
        </FormField>
        <FormField label="Temperature at filtration" htmlFor="lot-temp" hint="Expected wine temperature on the day." error={errors.tempC?.message} required>
          <NumberInput id="lot-temp" unit={units.symbol('temperature')} {...form.register('tempC')} />
        </FormField>
        <FormField label="Notes" htmlFor="lot-notes" error={errors.notes?.message} className="sm:col-span-2">
          <Textarea id="lot-notes" {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
