import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { tankInputSchema } from '@shared/schemas/cellar';
import type { TankDto } from '@shared/types/cellar';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCreateTank } from '../api/create-tank';
import { useUpdateTank } from '../api/update-tank';
import { decimalText, requestSchema, toMetricOrKeep } from './form-values';

const fields = ['name', 'capacityL', 'notes'] as const;

/** Adds a tank, or edits one when `tank` is given. Capacity in the person's volume unit. */
export function TankFormDialog({ open, onClose, tank }: { open: boolean; onClose: () => void; tank?: TankDto | null }) {
  const units = useUnits();
  const create = useCreateTank();
  const update = useUpdateTank();
  const toast = useToast();
  const schema = useMemo(
    () =>
      z
        .object({ name: z.string(), capacityL: decimalText, notes: z.string() })
        .transform((v) => ({ ...v, capacityL: toMetricOrKeep(units.fromInput, 'volume', v.capacityL) }))
        .pipe(requestSchema(tankInputSchema)),
    // Rebuilt only when the person's unit system changes.
    [units.system],
  );
  const form = useForm({
    resolver: zodResolver(schema),
    values: { name: tank?.name ?? '', capacityL: tank ? units.toInput('volume', tank.capacityL, 1) : '', notes: tank?.notes ?? '' },
  });
  const { errors } = form.formState;

  const { alert, submit, close } = useFormSubmit(form, {
    fields,
    onClose,
    save: async (input, close) => {
      // An untouched capacity keeps its stored value exactly (no unit round trip).
      if (tank) await update.mutateAsync({ id: tank.id, input: form.formState.dirtyFields.capacityL ? input : { ...input, capacityL: tank.capacityL } });
      else await create.mutateAsync(input);
      toast.success(tank ? 'Tank saved' : 'Tank added', input.name);
      close();
    },
  });

  return (
    <Dialog
      open={open}
      onClose={close}
      title={tank ? `Edit ${tank.name}` : 'Add tank'}
      footer={
        <>
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" form="tank-form" loading={create.isPending || update.isPending}>
            {tank ? 'Save tank' : 'Add tank'}
          </Button>
        </>
      }
    >
      <form id="tank-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="Name" htmlFor="tank-name" error={errors.name?.message} required>
          <Input id="tank-name" autoComplete="off" data-autofocus {...form.register('name')} />
        </FormField>
        <FormField label="Capacity" htmlFor="tank-capacity" error={errors.capacityL?.message} required>
          <NumberInput id="tank-capacity" unit={units.symbol('volume')} {...form.register('capacityL')} />
        </FormField>
        <FormField label="Notes" htmlFor="tank-notes" error={errors.notes?.message}>
          <Textarea id="tank-notes" {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
