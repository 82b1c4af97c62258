import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useId } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { createPlanInputSchema, sanitationKindLabels, sanitationKinds } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { paths } from '@/config/paths';
import { useFormSubmit } from '@/lib/form-errors';
import { useCreatePlan } from '../api/create-plan';
import { useLineOptions } from '../api/get-line-options';
import { useUpdatePlan } from '../api/update-plan';

const fieldNames = ['name', 'plannedDate', 'lineId', 'startTime', 'sanitationKind', 'notes'] as const;

/** New plan, or the plan's day details (name, date, line, start, sanitation, notes). */
export function PlanFormDialog({ open, plan, onClose, defaultDate }: { open: boolean; plan: PlanDto | null; onClose: () => void; defaultDate?: string }) {
  const id = useId();
  const navigate = useNavigate();
  const lines = useLineOptions(open);
  const create = useCreatePlan();
  const update = useUpdatePlan();
  const form = useForm({
    resolver: zodResolver(createPlanInputSchema),
    defaultValues: { name: '', plannedDate: defaultDate ?? '', lineId: '', startTime: '07:00', sanitationKind: 'hot-water' as const, notes: '' },
  });
  const { register, reset, setValue, formState } = form;
  const { alert: formError, setAlert: setFormError, submit: onSubmit } = useFormSubmit(form, {
    fields: fieldNames,
    save: async (values) => {
      if (plan) {
        await update.mutateAsync({ id: plan.id, changes: values });
        onClose();
      } else {
        const created = await create.mutateAsync(values);
        onClose();
        navigate(paths.plan(created.id));
      }
    },
  });

  useEffect(() => {
    if (!open) return;
    setFormError(null);
    reset(
      plan
        ? { name: plan.name, plannedDate: plan.plannedDate, lineId: plan.line?.id ?? '', startTime: plan.startTime, sanitationKind: plan.sanitationKind, notes: plan.notes }
        : { name: '', plannedDate: defaultDate ?? '', lineId: '', startTime: '07:00', sanitationKind: 'hot-water', notes: '' },
    );
  }, [open, plan, reset, defaultDate]);

  // A winery with one line: choose it.
  const only = lines.data?.items.length === 1 ? lines.data.items[0].id : null;
  useEffect(() => {
    if (open && !plan && only) setValue('lineId', only);
  }, [open, plan, only, setValue]);

  const pending = create.isPending || update.isPending;
  const e = formState.errors;
  const noLines = lines.data && lines.data.items.length === 0;

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={plan ? 'Edit the day' : 'New plan'}
      description={plan ? undefined : 'A bottling day on one line. Add the lots and their trains next.'}
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form={`${id}-form`} loading={pending} disabled={Boolean(noLines)}>
            {plan ? 'Save' : 'Create plan'}
          </Button>
        </>
      }
    >
      <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
        {formError ? <p role="alert" className="text-sm font-semibold text-stop-700">{formError}</p> : null}
        <FormField label="Name" htmlFor={`${id}-name`} error={e.name?.message} required>
          <Input id={`${id}-name`} data-autofocus autoComplete="off" placeholder="e.g. Whites, week 24" {...register('name')} />
        </FormField>
        <div className="grid gap-3 sm:grid-cols-2">
          <FormField label="Bottling date" htmlFor={`${id}-date`} error={e.plannedDate?.message} required>
            <Input id={`${id}-date`} type="date" {...register('plannedDate')} />
          </FormField>
          <FormField label="Start of sanitation" htmlFor={`${id}-start`} error={e.startTime?.message} hint="Local time, 24-hour.">
            <Input id={`${id}-start`} type="time" step={60} {...register('startTime')} />
          </FormField>
        </div>
        <FormField
          label="Bottling line"
          htmlFor={`${id}-line`}
          error={e.lineId?.message}
          hint={noLines ? 'Add a bottling line under Equipment first.' : undefined}
          required
        >
          <Select id={`${id}-line`} placeholder="Choose a line" options={(lines.data?.items ?? []).map((l) => ({ value: l.id, label: l.name }))} {...register('lineId')} />
        </FormField>
        <FormField label="Sanitation" htmlFor={`${id}-san`} error={e.sanitationKind?.message}>
          <Select id={`${id}-san`} options={sanitationKinds.map((k) => ({ value: k, label: sanitationKindLabels[k] }))} {...register('sanitationKind')} />
        </FormField>
        <FormField label="Notes" htmlFor={`${id}-notes`} error={e.notes?.message}>
          <Textarea id={`${id}-notes`} rows={2} {...register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
