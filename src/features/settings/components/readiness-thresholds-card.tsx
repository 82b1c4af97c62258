import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { readinessThresholdsSchema, WINE_STYLES, type ReadinessThresholds } from '@shared/engine';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { NumberInput } from '@/components/ui/input';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { useCan } from '@/lib/session';
import { useWinerySettings } from '../api/get-winery-settings';
import { useUpdateWinerySettings } from '../api/update-winery-settings';

const styleLabels: Record<(typeof WINE_STYLES)[number], string> = {
  white: 'White',
  'rosé': 'Rosé',
  red: 'Red',
  sweet: 'Sweet',
  sparkling: 'Sparkling',
};

/** The winery's readiness thresholds: shown to everyone, edited by the owner, sources beside them. */
export function ReadinessThresholdsCard() {
  const settings = useWinerySettings();
  const update = useUpdateWinerySettings();
  const mayEdit = useCan('settings:edit');
  const toast = useToast();
  const form = useForm<ReadinessThresholds>({ resolver: zodResolver(readinessThresholdsSchema), values: settings.data?.readinessThresholds });
  const { errors, isDirty } = form.formState;

  if (settings.isPending) return <LoadingState />;
  if (settings.isError) return <ErrorState message={settings.error.message} onRetry={() => settings.refetch()} />;
  const data = settings.data;

  const save = form.handleSubmit(async (values) => {
    try {
      await update.mutateAsync({ readinessThresholds: values });
      toast.success('Thresholds saved', 'Readiness verdicts now use them.');
    } catch (error) {
      toast.error('Not saved', error instanceof Error ? error.message : 'Try again.');
    }
  });
  const restore = async () => {
    await update.mutateAsync({ readinessThresholds: null });
    toast.info('Defaults restored');
  };

  const num = (name: Parameters<typeof form.register>[0], unit: string, label: string) => (
    <NumberInput
      aria-label={label}
      unit={unit}
      wrapperClassName="max-w-40"
      disabled={!mayEdit}
      invalid={Boolean(name.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], errors))}
      {...form.register(name, { valueAsNumber: true })}
    />
  );

  return (
    <Card
      title="Readiness thresholds"
      description={
        data.readinessThresholdsAreDefault
          ? 'Defaults from trade practice, with their sources. The owner can set the winery’s own.'
          : 'This winery’s own thresholds. The defaults and their sources are shown below each.'
      }
    >
      <form onSubmit={save} noValidate className="flex flex-col gap-6">
        <fieldset>
          <legend className="mb-2 text-sm font-semibold text-ink-800">Turbidity before membrane filtration</legend>
          <div className="overflow-x-auto">
            <table className="w-full min-w-[28rem] text-sm">
              <thead>
                <tr className="border-b border-ink-200 text-left text-ink-600">
                  <th className="py-2 pr-3 font-semibold">Style</th>
                  <th className="py-2 pr-3 font-semibold">Ready up to</th>
                  <th className="py-2 font-semibold">Borderline margin above</th>
                </tr>
              </thead>
              <tbody>
                {WINE_STYLES.map((style) => (
                  <tr key={style} className="border-b border-ink-100 align-top">
                    <td className="py-2 pr-3 font-semibold text-ink-900">{styleLabels[style]}</td>
                    <td className="py-2 pr-3">{num(`turbidity.${style}.limitNtu`, 'NTU', `${styleLabels[style]} turbidity limit`)}</td>
                    <td className="py-2">{num(`turbidity.${style}.borderlineMarginNtu`, 'NTU', `${styleLabels[style]} borderline margin`)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <p className="mt-2 text-xs text-ink-500">Default source: {data.defaultReadinessThresholds.turbidity.white.source}</p>
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-sm font-semibold text-ink-800">Clogging index (T400 − 2·T200)</legend>
          <label className="flex flex-col gap-1 text-sm text-ink-700">
            Ready up to {num('cloggingIndex.readyMaxS', 's', 'Clogging index ready limit')}
          </label>
          <label className="flex flex-col gap-1 text-sm text-ink-700">
            Borderline up to {num('cloggingIndex.borderlineMaxS', 's', 'Clogging index borderline limit')}
          </label>
          {errors.cloggingIndex ? (
            <p role="alert" className="text-sm font-semibold text-stop-700 sm:col-span-2">
              {errors.cloggingIndex.message ?? errors.cloggingIndex.root?.message ?? 'Check the clogging index limits.'}
            </p>
          ) : null}
          <p className="text-xs text-ink-500 sm:col-span-2">Default source: {data.defaultReadinessThresholds.cloggingIndex.source}</p>
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-sm font-semibold text-ink-800">Vmax disc test: capacity against the planned load</legend>
          <label className="flex flex-col gap-1 text-sm text-ink-700">
            Ready from {num('vmax.readyMinSafetyFactor', '×', 'Vmax ready factor')}
          </label>
          <label className="flex flex-col gap-1 text-sm text-ink-700">
            Borderline from {num('vmax.borderlineMinSafetyFactor', '×', 'Vmax borderline factor')}
          </label>
          <p className="text-xs text-ink-500 sm:col-span-2">Default source: {data.defaultReadinessThresholds.vmax.source}</p>
        </fieldset>
        {mayEdit ? (
          <div className="flex flex-wrap gap-2">
            <Button type="submit" loading={update.isPending} disabled={!isDirty}>
              Save thresholds
            </Button>
            {!data.readinessThresholdsAreDefault ? (
              <Button variant="secondary" onClick={restore}>
                Restore defaults
              </Button>
            ) : null}
          </div>
        ) : (
          <p className="text-sm text-ink-600">Only the winery’s owner changes these.</p>
        )}
      </form>
    </Card>
  );
}
