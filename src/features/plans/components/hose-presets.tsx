import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useId } from 'react';
import { useForm } from 'react-hook-form';
import { convert } from '@shared/engine';
import { createHosePresetInputSchema } from '@shared/schemas/hose-presets';
import type { TrainHoseInput } from '@shared/schemas/plans';
import type { HosePresetDto } from '@shared/types/hose-presets';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useFormSubmit } from '@/lib/form-errors';
import { useCan } from '@/lib/session';
import type { useUnits } from '@/lib/units';
import { useCreateHosePreset, useHosePresets } from '../api/hose-presets';

type Units = ReturnType<typeof useUnits>;

/** "38 mm × 12 m, ΣK 2.5" (or inches and feet in US customary). */
export function hoseSummary(h: Pick<TrainHoseInput, 'diameterMm' | 'lengthM' | 'sumK'>, u: Units): string {
  const d = u.system === 'us' ? `${Number(convert(h.diameterMm, 'mm', 'inch').toFixed(2))} in` : `${Number(h.diameterMm.toFixed(1))} mm`;
  const k = h.sumK ? `, ΣK ${h.sumK}` : '';
  return `${d} × ${u.format('length', h.lengthM)}${k}`;
}

/** The winery's hose presets in a select; choosing one hands it over and the select goes back to its prompt. */
export function HosePresetPicker({ id, onPick, units: u }: { id: string; onPick: (p: HosePresetDto) => void; units: Units }) {
  const presets = useHosePresets();
  const items = presets.data?.items ?? [];
  const options = items.map((p) => ({ value: p.id, label: `${p.name} (${hoseSummary(p, u)})` }));
  return (
    <label className="flex min-w-0 flex-1 flex-col text-xs text-ink-700" htmlFor={id}>
      Pick a preset
      <Select
        id={id}
        value=""
        disabled={items.length === 0}
        placeholder={presets.isLoading ? 'Loading presets…' : items.length === 0 ? 'No presets saved yet' : 'Add a saved hose…'}
        options={options}
        onChange={(e) => {
          const p = items.find((x) => x.id === e.target.value);
          if (p) onPick(p);
        }}
      />
    </label>
  );
}

const nameSchema = createHosePresetInputSchema.pick({ name: true });

/** Saves one hose of the train (figures in mm and m) as a winery preset, under a name. */
export function SaveHosePresetDialog({ hose, onClose, units: u }: { hose: TrainHoseInput | null; onClose: () => void; units: Units }) {
  const id = useId();
  const create = useCreateHosePreset();
  const form = useForm({ resolver: zodResolver(nameSchema), defaultValues: { name: '' } });
  const { register, reset, formState } = form;
  const { alert: formError, setAlert: setFormError, submit: onSubmit } = useFormSubmit(form, {
    fields: ['name'],
    save: async ({ name }) => {
      if (!hose) return;
      await create.mutateAsync({ name, diameterMm: hose.diameterMm, lengthM: hose.lengthM, roughnessMm: hose.roughnessMm ?? null, sumK: hose.sumK ?? null });
      onClose();
    },
  });
  useEffect(() => {
    if (!hose) return;
    setFormError(null);
    reset({ name: hoseSummary(hose, u) });
  }, [hose, reset]);
  return (
    <Dialog
      open={hose !== null}
      onClose={onClose}
      size="sm"
      title="Save the hose as a preset"
      description={hose ? `${hoseSummary(hose, u)} — the winery’s presets can be picked on any train.` : undefined}
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form={`${id}-form`} loading={create.isPending}>
            Save preset
          </Button>
        </>
      }
    >
      <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
        {formError ? <p role="alert" className="text-sm font-semibold text-stop-700">{formError}</p> : null}
        <FormField label="Name" htmlFor={`${id}-name`} error={formState.errors.name?.message} required>
          <Input id={`${id}-name`} data-autofocus autoComplete="off" {...register('name')} />
        </FormField>
      </form>
    </Dialog>
  );
}

/** True when the person may save presets (as for drafting plans). */
export const useCanSavePresets = () => useCan('plans:draft');
