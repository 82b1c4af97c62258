import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { INTEGRITY_TESTS, integrityTestLabels, recordIntegrityInputSchema, WETTING_FLUIDS, wettingFluidLabels, type IntegrityTestKind, type WettingFluid } from '@shared/schemas/care';
import type { CareTargetDto, IntegrityResultDto } from '@shared/types/care';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { StatusBadge } from '@/components/ui/status-badge';
import { useUnits } from '@/lib/units';
import { useRecordIntegrityTest } from '../api/record-integrity-test';
import { PressureCaution } from './care-cautions';
import { integrityPreview, testedEquivalents } from './care-preview';
import { decimalText, finite, isoOrNow, localDateTime, parseTyped, requestSchema, toMetricOrKeep } from './form-values';
import { SaveOutcome, useCareSubmit } from './save-outcome';

const fields = ['test', 'bubblePointBar', 'diffusionMlMin', 'decayMbar', 'testMin', 'tempC', 'wettingFluid', 'ethanolPctVol', 'notes', 'at'] as const;

/** Records a bubble-point, diffusion or pressure-hold test; previews pass or fail as the reading is typed. */
export function IntegrityForm({ target, onSaved }: { target: CareTargetDto; onSaved: (r: IntegrityResultDto) => void }) {
  const units = useUnits();
  const record = useRecordIntegrityTest();
  // Pressure decay is typed in mbar (metric) or psi (US customary).
  const decayUnit = units.system === 'us' ? units.symbol('dp') : 'mbar';
  const decayToMbar = (v: number | null) => (v === null || !Number.isFinite(v) || units.system !== 'us' ? v : units.fromInput('dp', v) * 1000);

  const schema = useMemo(
    () =>
      z
        .object({
          test: z.string(),
          bubblePointBar: decimalText,
          diffusionMlMin: decimalText,
          decayMbar: decimalText,
          testMin: decimalText,
          tempC: decimalText,
          wettingFluid: z.string(),
          ethanolPctVol: decimalText,
          notes: z.string(),
          at: z.string(),
        })
        .transform((v) => ({
          test: v.test,
          bubblePointBar: v.test === 'bubble-point' ? toMetricOrKeep(units.fromInput, 'pressure', v.bubblePointBar) : null,
          diffusionMlMin: v.test === 'diffusion' ? v.diffusionMlMin : null,
          decayMbar: v.test === 'pressure-hold' ? decayToMbar(v.decayMbar) : null,
          testMin: v.test === 'pressure-hold' ? v.testMin : null,
          tempC: toMetricOrKeep(units.fromInput, 'temperature', v.tempC),
          wettingFluid: v.test === 'bubble-point' ? v.wettingFluid || undefined : undefined,
          ethanolPctVol: v.test === 'bubble-point' && v.wettingFluid !== 'water' ? v.ethanolPctVol : null,
          notes: v.notes.trim() || undefined,
          at: isoOrNow(v.at),
        }))
        .pipe(requestSchema(recordIntegrityInputSchema)),
    [units.system],
  );

  const form = useForm({
    resolver: zodResolver(schema),
    defaultValues: { test: 'bubble-point', bubblePointBar: '', diffusionMlMin: '', decayMbar: '', testMin: '10', tempC: '', wettingFluid: 'water', ethanolPctVol: '', notes: '', at: localDateTime(new Date()) },
  });
  const { errors } = form.formState;
  const [test, bp, diff, decay, testMin, temp, fluidText, strength] = form.watch(['test', 'bubblePointBar', 'diffusionMlMin', 'decayMbar', 'testMin', 'tempC', 'wettingFluid', 'ethanolPctVol']);
  const fluid: WettingFluid = (WETTING_FLUIDS as readonly string[]).includes(fluidText) ? (fluidText as WettingFluid) : 'water';
  const testKind = (INTEGRITY_TESTS as readonly string[]).includes(test) ? (test as IntegrityTestKind) : 'bubble-point';

  const typed = (s: string) => finite(parseTyped(s));
  const bpTyped = typed(bp);
  const tempTyped = typed(temp);
  const decayTyped = typed(decay);
  const preview = integrityPreview(
    target,
    testKind,
    {
      bubblePointBar: bpTyped === undefined ? undefined : units.fromInput('pressure', bpTyped),
      diffusionMlMin: typed(diff),
      decayMbar: decayTyped === undefined ? undefined : (decayToMbar(decayTyped) as number),
      testMin: typed(testMin),
      tempC: tempTyped === undefined ? undefined : units.fromInput('temperature', tempTyped),
      wettingFluid: fluid,
      ethanolPctVol: typed(strength),
    },
    units.system,
  );

  const { alert, kept, submit } = useCareSubmit(form, {
    fields,
    save: (input) => record.mutateAsync({ cartridgeId: target.id, input, serial: target.serial }),
    cleared: () => ({ bubblePointBar: '', diffusionMlMin: '', decayMbar: '', notes: '', at: localDateTime(new Date()) }),
    onSaved,
  });

  const limitHint =
    testKind === 'bubble-point'
      ? target.bubblePointMinBar !== null
        ? `Minimum for ${target.typeName}: ${units.format('pressure', target.bubblePointMinBar)} (water-wet, from the catalogue).`
        : undefined
      : target.diffusionMaxMlMinPer10in !== null
        ? target.housingElementEquivalents !== null
          ? `Limit for ${target.typeName}: ${target.diffusionMaxMlMinPer10in} mL/min per 10″, × ${testedEquivalents(target)} for all the cartridges in ${target.housingName ?? 'the housing'} (the test covers the whole housing).`
          : `Limit for ${target.typeName}: ${target.diffusionMaxMlMinPer10in} mL/min per 10″, × ${target.elementEquivalents} for this ${target.lengthIn}″ cartridge.`
        : undefined;

  return (
    <form id="integrity-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
      <PressureCaution />
      <FormField label="Test" htmlFor="it-test" error={errors.test?.message}>
        <Select id="it-test" {...form.register('test')} options={INTEGRITY_TESTS.map((k) => ({ value: k, label: integrityTestLabels[k] }))} />
      </FormField>
      {testKind === 'bubble-point' ? (
        <FormField label="Bubble point read" htmlFor="it-bp" error={errors.bubblePointBar?.message} hint={limitHint} required>
          <NumberInput id="it-bp" unit={units.symbol('pressure')} {...form.register('bubblePointBar')} />
        </FormField>
      ) : null}
      {testKind === 'diffusion' ? (
        <FormField label="Diffusion flow measured" htmlFor="it-diff" error={errors.diffusionMlMin?.message} hint={limitHint} required>
          <NumberInput id="it-diff" unit="mL/min" {...form.register('diffusionMlMin')} />
        </FormField>
      ) : null}
      {testKind === 'pressure-hold' ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField
            label="Pressure decay read"
            htmlFor="it-decay"
            error={errors.decayMbar?.message}
            required
            hint={target.housingName ? `${target.housingName}: upstream gas volume ${target.upstreamGasVolumeL ?? '—'} L.` : 'The cartridge is not in a housing.'}
          >
            <NumberInput id="it-decay" unit={decayUnit} {...form.register('decayMbar')} />
          </FormField>
          <FormField label="Test time" htmlFor="it-min" error={errors.testMin?.message} required>
            <NumberInput id="it-min" unit="min" {...form.register('testMin')} />
          </FormField>
        </div>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField label="Liquid temperature" htmlFor="it-temp" error={errors.tempC?.message} hint="Corrects the bubble-point minimum for the wetting liquid at this temperature.">
          <NumberInput id="it-temp" unit={units.symbol('temperature')} {...form.register('tempC')} />
        </FormField>
        {testKind === 'bubble-point' ? (
          <FormField label="Wetted with" htmlFor="it-fluid" error={errors.wettingFluid?.message} hint="The expected bubble point scales with the liquid’s surface tension.">
            <Select id="it-fluid" {...form.register('wettingFluid')} options={WETTING_FLUIDS.map((k) => ({ value: k, label: wettingFluidLabels[k] }))} />
          </FormField>
        ) : null}
        {testKind === 'bubble-point' && fluid !== 'water' ? (
          <FormField label="Alcoholic strength" htmlFor="it-strength" error={errors.ethanolPctVol?.message} required>
            <NumberInput id="it-strength" unit="% vol" {...form.register('ethanolPctVol')} />
          </FormField>
        ) : null}
      </div>
      <div aria-live="polite" className="rounded border border-ink-200 bg-ink-50 px-3 py-2">
        <p className="text-sm font-semibold text-ink-700">Before saving</p>
        {preview && 'verdict' in preview ? (
          <p className="mt-1 flex flex-wrap items-center gap-2 text-base">
            <StatusBadge tone={preview.verdict.pass ? 'ok' : preview.verdict.retest ? 'watch' : 'stop'}>
              {preview.verdict.pass ? 'Would pass' : preview.verdict.retest ? 'Re-test with water' : 'Would fail'}
            </StatusBadge>
            <span>{preview.verdict.reason}</span>
          </p>
        ) : preview && 'missing' in preview ? (
          <p className="mt-1 text-base text-watch-800">{preview.missing}</p>
        ) : (
          <p className="mt-1 text-base text-ink-600">Enter the reading to see pass or fail.</p>
        )}
      </div>
      <FormField label="Notes" htmlFor="it-notes" error={errors.notes?.message}>
        <Textarea id="it-notes" rows={2} {...form.register('notes')} placeholder="Gas, test pressure, retest or corrective action" />
      </FormField>
      <FormField label="When" htmlFor="it-at" error={errors.at?.message}>
        <Input id="it-at" type="datetime-local" {...form.register('at')} />
      </FormField>
      <SaveOutcome kept={kept} alert={alert} />
      <Button type="submit" size="lg" loading={record.isPending} className="w-full sm:w-auto">
        Save test
      </Button>
    </form>
  );
}
