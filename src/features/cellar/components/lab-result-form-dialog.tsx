import { zodResolver } from '@hookform/resolvers/zod';
import { Plus, Trash2 } from 'lucide-react';
import { useMemo } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { z } from 'zod';
import { cloggingIndex, cloggingIndexVerdict, defaultReadinessThresholds, type ReadinessThresholds } from '@shared/engine';
import { labResultInputSchema } from '@shared/schemas/cellar';
import type { LabResultDto } from '@shared/types/cellar';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { Quantity } from '@/components/ui/quantity';
import { useToast } from '@/components/ui/toast';
import { useFormSubmit } from '@/lib/form-errors';
import { useUnits } from '@/lib/units';
import { useCreateLabResult } from '../api/create-lab-result';
import { useUpdateLabResult } from '../api/update-lab-result';
import { decimalText, numberText, requestSchema, toMetricOrKeep } from './form-values';
import { formatDateTime, toDateTimeInput } from '@/lib/dates';

const fields = ['sampledAt', 'turbidityNtu', 't200s', 't400s', 'freeSo2MgL', 'discDiameterMm', 'discPressureBar', 'discPoints', 'notes'] as const;
const localDateTime = (d: Date) => toDateTimeInput(d);

/** Parses typed text the way the form does, for the live preview. */
const typed = (s: string) => decimalText.parse(s ?? '');

type CiLimits = Pick<ReadinessThresholds['cloggingIndex'], 'readyMaxS' | 'borderlineMaxS'>;

/** Clogging index of what is typed so far, judged as the lot's readiness judges it (the server computes the saved figure). */
function CloggingPreview({ t200, t400, limits }: { t200: string; t400: string; limits: CiLimits }) {
  const a = typed(t200);
  const b = typed(t400);
  if (a === null || b === null || !Number.isFinite(a) || !Number.isFinite(b)) return null;
  try {
    const ci = cloggingIndex(a, b);
    return (
      <p className="text-sm text-ink-700 sm:col-span-2" aria-live="polite">
        Clogging index <Quantity value={ci} unit="s" digits={0} className="font-semibold" /> — {cloggingIndexVerdict(ci, limits).reason}
      </p>
    );
  } catch (error) {
    return (
      <p className="text-sm text-watch-800 sm:col-span-2" aria-live="polite">
        {error instanceof RangeError ? error.message : null}
      </p>
    );
  }
}

/** Adds a lab result to a lot, or edits one when `result` is given. */
export function LabResultFormDialog({
  open,
  onClose,
  lotId,
  result,
  ciLimits = defaultReadinessThresholds.cloggingIndex,
}: {
  open: boolean;
  onClose: () => void;
  lotId: string;
  result?: LabResultDto | null;
  /** The winery's clogging-index limits (the lot's readiness thresholds). */
  ciLimits?: CiLimits;
}) {
  const units = useUnits();
  const create = useCreateLabResult();
  const update = useUpdateLabResult();
  const toast = useToast();

  const schema = useMemo(
    () =>
      z
        .object({
          sampledAt: z.string(),
          turbidityNtu: decimalText,
          t200s: decimalText,
          t400s: decimalText,
          freeSo2MgL: decimalText,
          discDiameterMm: decimalText,
          discPressureBar: decimalText,
          discPoints: z.array(z.object({ timeS: decimalText, volumeMl: decimalText })),
          notes: z.string(),
        })
        .transform((v) => {
          const when = v.sampledAt ? new Date(v.sampledAt) : null;
          const points = v.discPoints.filter((p) => p.timeS !== null || p.volumeMl !== null);
          return {
            ...v,
            sampledAt: when && !Number.isNaN(when.getTime()) ? when.toISOString() : '',
            // Disc settings are kept only with a disc test to go with them.
            discDiameterMm: points.length ? v.discDiameterMm : null,
            discPressureBar: points.length ? toMetricOrKeep(units.fromInput, 'pressure', v.discPressureBar) : null,
            discPoints: points.length ? points : null,
          };
        })
        .pipe(requestSchema(labResultInputSchema)),
    // Rebuilt only when the person's unit system changes.
    [units.system],
  );

  const form = useForm({
    resolver: zodResolver(schema),
    values: {
      sampledAt: localDateTime(result ? new Date(result.sampledAt) : new Date()),
      turbidityNtu: numberText(result?.turbidityNtu),
      t200s: numberText(result?.t200s),
      t400s: numberText(result?.t400s),
      freeSo2MgL: numberText(result?.freeSo2MgL),
      discDiameterMm: numberText(result?.disc?.diameterMm ?? (result ? null : 25)),
      discPressureBar: result?.disc?.pressureBar != null ? units.toInput('pressure', result.disc.pressureBar, 2) : units.toInput('pressure', 2, 1),
      discPoints: (result?.disc?.points ?? []).map((p) => ({ timeS: String(p.timeS), volumeMl: String(p.volumeMl) })),
      notes: result?.notes ?? '',
    },
  });
  const points = useFieldArray({ control: form.control, name: 'discPoints' });
  const { errors } = form.formState;
  const [t200, t400] = form.watch(['t200s', 't400s']);

  const { alert, submit, close } = useFormSubmit(form, {
    fields,
    onClose,
    save: async (input, close) => {
      const saved = result ? await update.mutateAsync({ lotId, id: result.id, input }) : await create.mutateAsync({ lotId, input });
      const disc = saved.disc && !saved.disc.computable ? ` Vmax not computable: ${saved.disc.reason}` : '';
      toast.success(result ? 'Lab result saved' : 'Lab result added', `Sampled ${formatDateTime(saved.sampledAt)}.${disc}`);
      close();
    },
  });

  const pointError = (i: number, key: 'timeS' | 'volumeMl') => errors.discPoints?.[i]?.[key]?.message;

  return (
    <Dialog
      open={open}
      onClose={close}
      size="lg"
      title={result ? 'Edit lab result' : 'Add lab result'}
      description="Enter what the lab measured; leave the rest empty. Clogging index and Vmax are computed from the times and the disc test."
      footer={
        <>
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" form="lab-result-form" loading={create.isPending || update.isPending}>
            {result ? 'Save lab result' : 'Add lab result'}
          </Button>
        </>
      }
    >
      <form id="lab-result-form" onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
        {alert ? (
          <p role="alert" className="text-sm font-semibold text-stop-700 sm:col-span-2">
            {alert}
          </p>
        ) : null}
        <FormField label="Sampled" htmlFor="lr-sampled" error={errors.sampledAt?.message} required>
          <Input id="lr-sampled" type="datetime-local" data-autofocus {...form.register('sampledAt')} />
        </FormField>
        <FormField label="Turbidity" htmlFor="lr-turbidity" error={errors.turbidityNtu?.message}>
          <NumberInput id="lr-turbidity" unit="NTU" {...form.register('turbidityNtu')} />
        </FormField>
        <FormField label="Time to 200 mL" htmlFor="lr-t200" hint="Clogging test, from the start." error={errors.t200s?.message}>
          <NumberInput id="lr-t200" unit="s" {...form.register('t200s')} />
        </FormField>
        <FormField label="Time to 400 mL" htmlFor="lr-t400" hint="Clogging test, from the start." error={errors.t400s?.message}>
          <NumberInput id="lr-t400" unit="s" {...form.register('t400s')} />
        </FormField>
        <CloggingPreview t200={t200} t400={t400} limits={ciLimits} />
        <FormField label="Free SO₂" htmlFor="lr-so2" error={errors.freeSo2MgL?.message}>
          <NumberInput id="lr-so2" unit="mg/L" {...form.register('freeSo2MgL')} />
        </FormField>

        <fieldset className="flex flex-col gap-3 rounded border border-ink-200 p-3 sm:col-span-2">
          <legend className="px-1 text-sm font-semibold text-ink-800">Vmax disc test (optional)</legend>
          <p className="text-sm text-ink-600">Filtrate volume at constant pressure over time. At least 3 points; Vmax and the initial flux come from the standard-blocking fit.</p>
          <div className="grid gap-3 sm:grid-cols-2">
            <FormField label="Disc diameter" htmlFor="lr-disc-d" hint="Effective (wetted) diameter." error={errors.discDiameterMm?.message}>
              <NumberInput id="lr-disc-d" unit="mm" {...form.register('discDiameterMm')} />
            </FormField>
            <FormField label="Test pressure" htmlFor="lr-disc-p" error={errors.discPressureBar?.message}>
              <NumberInput id="lr-disc-p" unit={units.symbol('pressure')} {...form.register('discPressureBar')} />
            </FormField>
          </div>
          {errors.discPoints?.message || errors.discPoints?.root?.message ? (
            <p role="alert" className="text-sm font-semibold text-stop-700">
              {errors.discPoints?.message ?? errors.discPoints?.root?.message}
            </p>
          ) : null}
          {points.fields.length > 0 ? (
            <ol className="flex flex-col gap-2" aria-label="Disc test points">
              {points.fields.map((f, i) => (
                <li key={f.id} className="grid grid-cols-[1fr_1fr_auto] items-start gap-2">
                  <FormField label={`Time ${i + 1}`} htmlFor={`lr-pt-${i}-t`} error={pointError(i, 'timeS')}>
                    <NumberInput id={`lr-pt-${i}-t`} unit="s" {...form.register(`discPoints.${i}.timeS`)} />
                  </FormField>
                  <FormField label={`Volume ${i + 1}`} htmlFor={`lr-pt-${i}-v`} error={pointError(i, 'volumeMl')}>
                    <NumberInput id={`lr-pt-${i}-v`} unit="mL" {...form.register(`discPoints.${i}.volumeMl`)} />
                  </FormField>
                  <Button variant="ghost" className="mt-6 min-h-11 min-w-11 px-2" aria-label={`Remove point ${i + 1}`} onClick={() => points.remove(i)}>
                    <Trash2 aria-hidden="true" className="size-4" />
                  </Button>
                </li>
              ))}
            </ol>
          ) : null}
          <div>
            <Button variant="secondary" icon={<Plus aria-hidden="true" className="size-4" />} onClick={() => points.append({ timeS: '', volumeMl: '' })}>
              Add point
            </Button>
          </div>
        </fieldset>

        <FormField label="Notes" htmlFor="lr-notes" error={errors.notes?.message} className="sm:col-span-2">
          <Textarea id="lr-notes" {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
