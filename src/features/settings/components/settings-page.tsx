import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { roleLabels } from '@shared/permissions';
import { personNameSchema, unitSystemSchema, type UnitSystem } from '@shared/schemas/common';
import type { MeDto } from '@shared/types/api';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import { decimalMarkChosen, localeDecimalMark, setDecimalMark, useDecimalMark, type DecimalMark } from '@/lib/number-input';
import { useSetActiveWinery } from '@/lib/session';
import { cn } from '@/utils/cn';
import { useUpdateMe } from '../api/update-me';
import { AlertSettingsCard } from './alert-settings-card';
import { ReadinessThresholdsCard } from './readiness-thresholds-card';
import { WineryExportCard } from './winery-export-card';

const profileFormSchema = z.object({ name: personNameSchema, units: unitSystemSchema });

const unitChoices: { value: UnitSystem; label: string; examples: string }[] = [
  { value: 'metric', label: 'Metric', examples: 'bar · L and hL · L/h · °C · m²' },
  { value: 'us', label: 'US customary', examples: 'psi · gal · gal/min · °F · ft²' },
];

/** `children`: further cards the app adds at the end (alerts, calendar, mail). */
export function SettingsPage({ me, children }: { me: MeDto; children?: React.ReactNode }) {
  const update = useUpdateMe();
  const switchWinery = useSetActiveWinery();
  const toast = useToast();
  const form = useForm({ resolver: zodResolver(profileFormSchema), values: { name: me.user.name, units: me.user.units } });
  const { errors, isDirty } = form.formState;
  const units = form.watch('units');

  const submit = form.handleSubmit(async (values) => {
    try {
      await update.mutateAsync(values);
      toast.success('Settings saved');
    } catch (error) {
      const alert = applyServerErrors(error, form.setError, ['name', 'units']);
      if (alert) toast.error('Not saved', alert);
    }
  });

  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Settings" description="Your own preferences, which follow you in every winery, and this winery’s thresholds." />
      <Card title="You">
        <form onSubmit={submit} noValidate className="flex max-w-xl flex-col gap-5">
          <FormField label="Name" htmlFor="settings-name" error={errors.name?.message}>
            <Input id="settings-name" autoComplete="name" {...form.register('name')} />
          </FormField>
          <p className="text-sm text-ink-600">E-mail: {me.user.email}</p>
          <fieldset className="flex flex-col gap-2">
            <legend className="mb-1 text-sm font-semibold text-ink-800">Units</legend>
            <div className="grid gap-2 sm:grid-cols-2">
              {unitChoices.map((choice) => (
                <label
                  key={choice.value}
                  className={cn(
                    'flex min-h-11 cursor-pointer items-start gap-3 rounded-md border p-3',
                    units === choice.value ? 'border-primary-600 bg-primary-50' : 'border-ink-200 bg-white hover:border-ink-300',
                  )}
                >
                  <input type="radio" value={choice.value} className="mt-1 accent-primary-600" {...form.register('units')} />
                  <span>
                    <span className="block font-semibold text-ink-900">{choice.label}</span>
                    <span className="block text-sm text-ink-600">{choice.examples}</span>
                  </span>
                </label>
              ))}
            </div>
            <p className="text-sm text-ink-600">Figures are stored in SI and shown in the units you choose; forms accept them too.</p>
          </fieldset>
          <div>
            <Button type="submit" loading={update.isPending} disabled={!isDirty}>
              Save settings
            </Button>
          </div>
        </form>
      </Card>
      <DecimalMarkCard />
      <ReadinessThresholdsCard />
      <AlertSettingsCard />
      {children}
      <WineryExportCard />
      <Card title="Your wineries" description="Switch to work in another winery's records.">
        <ul className="divide-y divide-ink-100">
          {me.memberships.map((m) => (
            <li key={m.wineryId} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                <span className="font-semibold text-ink-900">{m.wineryName}</span>
                <span className="ml-2 text-sm text-ink-600">{roleLabels[m.role]}</span>
              </span>
              {m.wineryId === me.activeWineryId ? (
                <span className="text-sm text-ink-600">Current</span>
              ) : (
                <Button variant="secondary" size="sm" loading={switchWinery.isPending && switchWinery.variables === m.wineryId} onClick={() => switchWinery.mutate(m.wineryId)}>
                  Switch to this winery
                </Button>
              )}
            </li>
          ))}
        </ul>
      </Card>
    </div>
  );
}

const markChoices: { value: DecimalMark | 'auto'; label: string; example: string }[] = [
  { value: 'auto', label: 'As my browser’s language', example: '' },
  { value: '.', label: 'Decimal point', example: '3.5 · 3,000 is three thousand' },
  { value: ',', label: 'Decimal comma', example: '3,5 · 3.000 is three thousand' },
];

/** How this device reads typed numbers: the decimal mark, from the browser's language unless chosen. */
function DecimalMarkCard() {
  const mark = useDecimalMark();
  const chosen = decimalMarkChosen() ? mark : 'auto';
  const fromBrowser = localeDecimalMark(globalThis.navigator?.language);
  return (
    <Card title="Typing numbers" description="How figures typed on this device are read. An entry that could be read two ways, such as 3,000, says how it was read before you save.">
      <fieldset className="flex max-w-xl flex-col gap-2">
        <legend className="sr-only">Decimal mark</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {markChoices.map((c) => (
            <label
              key={c.value}
              className={cn(
                'flex min-h-11 cursor-pointer items-start gap-3 rounded-md border p-3',
                chosen === c.value ? 'border-primary-600 bg-primary-50' : 'border-ink-200 bg-white hover:border-ink-300',
              )}
            >
              <input
                type="radio"
                name="decimal-mark"
                value={c.value}
                checked={chosen === c.value}
                onChange={() => setDecimalMark(c.value === 'auto' ? null : c.value)}
                className="mt-1 accent-primary-600"
              />
              <span>
                <span className="block font-semibold text-ink-900">{c.label}</span>
                <span className="block text-sm text-ink-600">{c.value === 'auto' ? `Now: decimal ${fromBrowser === ',' ? 'comma' : 'point'}` : c.example}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
    </Card>
  );
}
