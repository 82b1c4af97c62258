import { useForm } from 'react-hook-form';
import { lineFigures } from '@shared/adapters/equipment';
import { createLineInputSchema } from '@shared/schemas/equipment';
import type { LineDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCreateLine } from '../api/create-line';
import { useUpdateLine } from '../api/update-line';
import { bodyResolver, inputText, typedNumber } from '../utils/typed-input';
import { DerivedFigure, quantityParts } from './derived-figure';

type LineForm = { name: string; bottlesPerHour: string; bottleMl: string; notes: string };
const fieldNames = ['name', 'bottlesPerHour', 'bottleMl', 'notes'] as const;

const toBody = (f: LineForm) => ({ name: f.name, bottlesPerHour: typedNumber(f.bottlesPerHour), bottleMl: typedNumber(f.bottleMl), notes: f.notes });
const resolver = bodyResolver(createLineInputSchema, toBody);

/** Add or change a bottling line; the flow it asks of the filters follows the fields as they are typed. */
export function LineFormDialog({ open, line, onClose }: { open: boolean; line: LineDto | null; onClose: () => void }) {
  return open ? <LineFormBody line={line} onClose={onClose} /> : null;
}

function LineFormBody({ line, onClose }: { line: LineDto | null; onClose: () => void }) {
  const units = useUnits();
  const toast = useToast();
  const create = useCreateLine();
  const update = useUpdateLine();
  const form = useForm<LineForm, unknown, ReturnType<typeof createLineInputSchema.parse>>({
    resolver,
    defaultValues: { name: line?.name ?? '', bottlesPerHour: inputText(line?.bottlesPerHour), bottleMl: inputText(line?.bottleMl ?? 750), notes: line?.notes ?? '' },
  });
  const { errors } = form.formState;
  const bph = typedNumber(form.watch('bottlesPerHour'));
  const ml = typedNumber(form.watch('bottleMl'));
  const figures = bph !== undefined && ml !== undefined ? lineFigures({ bottlesPerHour: bph, bottleMl: ml }) : null;

  const { alert, submit } = useFormSubmit(form, {
    fields: fieldNames,
    save: async (body) => {
      if (line) await update.mutateAsync({ id: line.id, changes: body });
      else await create.mutateAsync(body);
      toast.success(line ? 'Bottling line saved' : 'Bottling line added', body.name);
      onClose();
    },
  });

  return (
    <Dialog
      open
      onClose={onClose}
      title={line ? `Edit ${line.name}` : 'Add a bottling line'}
      description="The filler's speed and the bottle size set the flow the filters must carry."
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form="line-form" loading={create.isPending || update.isPending}>
            {line ? 'Save line' : 'Add line'}
          </Button>
        </>
      }
    >
      <form id="line-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="Name" htmlFor="line-name" error={errors.name?.message} required>
          <Input id="line-name" autoComplete="off" data-autofocus {...form.register('name')} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Filler speed" htmlFor="line-bph" error={errors.bottlesPerHour?.message} required>
            <NumberInput id="line-bph" unit="bottles/h" {...form.register('bottlesPerHour')} />
          </FormField>
          <FormField label="Bottle size" htmlFor="line-ml" error={errors.bottleMl?.message} required>
            <NumberInput id="line-ml" unit="mL" {...form.register('bottleMl')} />
          </FormField>
        </div>
        <div className="grid gap-2 sm:grid-cols-2" aria-live="polite">
          <DerivedFigure
            label="Filler draws"
            {...quantityParts(figures ? units.format('flow', figures.fillerFlowLh) : null)}
            missing="Enter the filler speed and the bottle size."
            how={figures ? `${bph?.toLocaleString('en-US')} bottles/h × ${ml} mL ÷ 1,000 = ${units.format('flow', figures.fillerFlowLh)}.` : ''}
          />
          <DerivedFigure
            data-testid="line-required-flow"
            label={`Filters must carry (+${figures?.marginPct ?? 10} %)`}
            {...quantityParts(figures ? units.format('flow', figures.requiredFlowLh) : null)}
            missing="Enter the filler speed and the bottle size."
            how={
              figures
                ? `${units.format('flow', figures.fillerFlowLh)} × (1 + ${figures.marginPct} % margin) = ${units.format('flow', figures.requiredFlowLh)}. The margin is common practice; plans may use another.`
                : ''
            }
          />
        </div>
        <FormField label="Notes" htmlFor="line-notes" error={errors.notes?.message}>
          <Textarea id="line-notes" rows={2} {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
