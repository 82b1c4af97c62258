import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { orderLeadTimeDaysSchema, timeZoneSchema } from '@shared/schemas/alerts';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { applyServerErrors } from '@/lib/form-errors';
import { parseNumberText } from '@/lib/number-input';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useWinerySettings } from '../api/get-winery-settings';
import { useUpdateWinerySettings } from '../api/update-winery-settings';

const schema = z.object({
  timeZone: timeZoneSchema,
  orderLeadTimeDays: orderLeadTimeDaysSchema,
  // In the person's ΔP unit here; the server checks the range in bar.
  gaugeResolution: z.preprocess(
    (v) => (typeof v === 'string' ? parseNumberText(v) : v),
    z.number({ error: 'Enter the gauge resolution as a number.' }).positive({ error: 'The resolution is above 0.' }),
  ),
});

/** The winery's time zone (digest hour, calendars) and the days an order of cartridges takes. */
export function AlertSettingsCard() {
  const settings = useWinerySettings();
  const update = useUpdateWinerySettings();
  const mayEdit = useCan('settings:edit');
  const toast = useToast();
  const units = useUnits();
  const form = useForm({
    resolver: zodResolver(schema),
    values: settings.data
      ? {
          timeZone: settings.data.timeZone,
          orderLeadTimeDays: settings.data.orderLeadTimeDays,
          gaugeResolution: Number(units.toInput('dp', settings.data.gaugeResolutionBar, 4)),
        }
      : undefined,
  });
  const { errors, isDirty } = form.formState;
  if (!settings.data) return null;
  const save = form.handleSubmit(async (values) => {
    try {
      const { gaugeResolution, ...rest } = values;
      const dirty = form.formState.dirtyFields;
      // An untouched resolution keeps its stored value exactly (no unit round trip).
      await update.mutateAsync({ ...rest, ...(dirty.gaugeResolution ? { gaugeResolutionBar: units.fromInput('dp', gaugeResolution) } : {}) });
      toast.success('Saved');
    } catch (error) {
      const alert = applyServerErrors(error, form.setError, ['timeZone', 'orderLeadTimeDays']);
      const field = error instanceof ApiError ? error.fields.gaugeResolutionBar : undefined;
      if (field) form.setError('gaugeResolution', { message: field });
      if (alert) toast.error('Not saved', alert);
    }
  });
  return (
    <Card title="Time zone, ordering and gauges" description="The daily digest goes at 07:00 in this time zone, and calendars show the day's steps in it. The lead time decides when a plan short of cartridges is urgent.">
      <form onSubmit={save} noValidate className="grid max-w-xl gap-4 sm:grid-cols-2">
        <FormField label="Time zone (IANA name)" htmlFor="winery-time-zone" error={errors.timeZone?.message}>
          <Input id="winery-time-zone" placeholder="Europe/Paris" disabled={!mayEdit} {...form.register('timeZone')} />
        </FormField>
        <FormField label="Order lead time" htmlFor="winery-lead-time" error={errors.orderLeadTimeDays?.message}>
          <NumberInput id="winery-lead-time" unit="days" disabled={!mayEdit} {...form.register('orderLeadTimeDays', { valueAsNumber: true })} />
        </FormField>
        <FormField
          label="Gauge resolution"
          htmlFor="winery-gauge-resolution"
          hint="The smallest ΔP step your gauges show. A run stage whose ΔP rises less than this is not counted as fouling."
          error={errors.gaugeResolution?.message}
        >
          <NumberInput id="winery-gauge-resolution" unit={units.symbol('dp')} disabled={!mayEdit} {...form.register('gaugeResolution')} />
        </FormField>
        {mayEdit ? (
          <div className="sm:col-span-2">
            <Button type="submit" loading={update.isPending} disabled={!isDirty}>
              Save
            </Button>
          </div>
        ) : null}
      </form>
    </Card>
  );
}
