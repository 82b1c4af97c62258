import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { orderLeadTimeDaysSchema, timeZoneSchema } from '@shared/schemas/alerts';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import { useCan } from '@/lib/session';
import { useWinerySettings } from '../api/get-winery-settings';
import { useUpdateWinerySettings } from '../api/update-winery-settings';

const schema = z.object({ timeZone: timeZoneSchema, orderLeadTimeDays: orderLeadTimeDaysSchema });

/** The winery's time zone (digest hour, calendars) and the days an order of cartridges takes. */
export function AlertSettingsCard() {
  const settings = useWinerySettings();
  const update = useUpdateWinerySettings();
  const mayEdit = useCan('settings:edit');
  const toast = useToast();
  const form = useForm({
    resolver: zodResolver(schema),
    values: settings.data ? { timeZone: settings.data.timeZone, orderLeadTimeDays: settings.data.orderLeadTimeDays } : undefined,
  });
  const { errors, isDirty } = form.formState;
  if (!settings.data) return null;
  const save = form.handleSubmit(async (values) => {
    try {
      await update.mutateAsync(values);
      toast.success('Saved');
    } catch (error) {
      const alert = applyServerErrors(error, form.setError, ['timeZone', 'orderLeadTimeDays']);
      if (alert) toast.error('Not saved', alert);
    }
  });
  return (
    <Card title="Time zone and ordering" description="The daily digest goes at 07:00 in this time zone, and calendars show the day's steps in it. The lead time decides when a plan short of cartridges is urgent.">
      <form onSubmit={save} noValidate className="grid max-w-xl gap-4 sm:grid-cols-2">
        <FormField label="Time zone (IANA name)" htmlFor="winery-time-zone" error={errors.timeZone?.message}>
          <Input id="winery-time-zone" placeholder="Europe/Paris" disabled={!mayEdit} {...form.register('timeZone')} />
        </FormField>
        <FormField label="Order lead time" htmlFor="winery-lead-time" error={errors.orderLeadTimeDays?.message}>
          <NumberInput id="winery-lead-time" unit="days" disabled={!mayEdit} {...form.register('orderLeadTimeDays', { valueAsNumber: true })} />
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
