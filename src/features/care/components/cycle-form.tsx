import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { careTemperatureHint } from '@shared/engine';
import { CYCLE_KINDS, cycleKindLabels, logCycleInputSchema, type CycleKind } from '@shared/schemas/care';
import type { CareTargetDto, CycleResultDto } from '@shared/types/care';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput } from '@/components/ui/input';
import { Quantity } from '@/components/ui/quantity';
import { Select } from '@/components/ui/select';
import { StatusBadge } from '@/components/ui/status-badge';
import { getDecimalMark } from '@/lib/number-input';
import { useUnits } from '@/lib/units';
import { useLogCycle } from '../api/log-cycle';
import { ChemicalCaution, HeatCaution } from './care-cautions';
import { recoveryPreview } from './care-preview';
import { decimalText, finite, isoOrNow, localDateTime, parseTyped, requestSchema, toMetricOrKeep } from './form-values';
import { SaveOutcome, useCareSubmit } from './save-outcome';

const fields = ['kind', 'tempC', 'durationMin', 'agent', 'concentrationPct', 'waterFlowBeforeLh', 'waterFlowAfterLh', 'waterTempC', 'flowDpBar', 'flowBasis', 'aboveRatingConfirmed', 'at'] as const;

/** Logs a regeneration, sanitation or sterilisation cycle of one cartridge. */
export function CycleForm({ target, onSaved }: { target: CareTargetDto; onSaved: (r: CycleResultDto) => void }) {
  const units = useUnits();
  const log = useLogCycle();

  const schema = useMemo(
    () =>
      z
        .object({
          kind: z.string(),
          tempC: decimalText,
          durationMin: decimalText,
          agent: z.string(),
          concentrationPct: decimalText,
          waterFlowBeforeLh: decimalText,
          waterFlowAfterLh: decimalText,
          waterTempC: decimalText,
          flowDpBar: decimalText,
          flowBasis: z.string(),
          aboveRatingConfirmed: z.boolean(),
          at: z.string(),
        })
        .transform((v) => ({
          kind: v.kind,
          tempC: toMetricOrKeep(units.fromInput, 'temperature', v.tempC),
          durationMin: v.durationMin,
          agent: v.kind === 'chemical' ? v.agent.trim() || undefined : undefined,
          concentrationPct: v.kind === 'chemical' ? v.concentrationPct : null,
          waterFlowBeforeLh: toMetricOrKeep(units.fromInput, 'flow', v.waterFlowBeforeLh),
          waterFlowAfterLh: toMetricOrKeep(units.fromInput, 'flow', v.waterFlowAfterLh),
          waterTempC: toMetricOrKeep(units.fromInput, 'temperature', v.waterTempC),
          // only with a flow: the ΔP it was measured at (left empty, the type's specification ΔP)
          flowDpBar: v.waterFlowBeforeLh === null && v.waterFlowAfterLh === null ? undefined : toMetricOrKeep(units.fromInput, 'dp', v.flowDpBar),
          flowBasis: v.flowBasis || undefined,
          aboveRatingConfirmed: v.aboveRatingConfirmed || undefined,
          at: isoOrNow(v.at),
        }))
        .pipe(requestSchema(logCycleInputSchema)),
    [units.system],
  );

  const form = useForm({
    resolver: zodResolver(schema),
    defaultValues: {
      kind: 'hot-water',
      tempC: '',
      durationMin: '',
      agent: '',
      concentrationPct: '',
      waterFlowBeforeLh: '',
      waterFlowAfterLh: '',
      waterTempC: '',
      // the type's specification ΔP, in the person's unit and decimal mark
      flowDpBar: units.toInput('dp', target.waterDpBar).replace('.', getDecimalMark()),
      flowBasis: 'cartridge',
      aboveRatingConfirmed: false,
      at: localDateTime(new Date()),
    },
  });
  const { errors } = form.formState;
  const [kind, before, after, waterTemp, basisText, cycleTemp, flowDpText] = form.watch(['kind', 'waterFlowBeforeLh', 'waterFlowAfterLh', 'waterTempC', 'flowBasis', 'tempC', 'flowDpBar']);
  const cycleKind = (CYCLE_KINDS as readonly string[]).includes(kind) ? (kind as CycleKind) : 'hot-water';

  const toFlow = (s: string) => {
    const v = finite(parseTyped(s));
    return v === undefined ? undefined : units.fromInput('flow', v);
  };
  const waterTempTyped = finite(parseTyped(waterTemp));
  const flowDpTyped = finite(parseTyped(flowDpText));
  const recovery = recoveryPreview(target, cycleKind, toFlow(before), toFlow(after), {
    waterTempC: waterTempTyped === undefined ? undefined : units.fromInput('temperature', waterTempTyped),
    flowDpBar: flowDpTyped === undefined ? undefined : units.fromInput('dp', flowDpTyped),
    flowBasis: basisText === 'housing' ? 'housing' : 'cartridge',
  });
  // hints never suggest more than the rating (the lower of the cartridge's and, when installed, the housing's)
  const hint = careTemperatureHint(cycleKind, target.maxTempC);
  const cycleTempTyped = finite(parseTyped(cycleTemp));
  const aboveRating = cycleTempTyped !== undefined && units.fromInput('temperature', cycleTempTyped) > target.maxTempC;

  const { alert, kept, submit } = useCareSubmit(form, {
    fields,
    save: (input) => log.mutateAsync({ cartridgeId: target.id, input, serial: target.serial }),
    // Once stored the rating's confirmation is asked again; kept on the device, it stays.
    cleared: (stored) => ({ tempC: '', durationMin: '', waterFlowBeforeLh: '', waterFlowAfterLh: '', ...(stored ? { aboveRatingConfirmed: false } : {}), at: localDateTime(new Date()) }),
    onSaved,
  });

  return (
    <form id="cycle-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
      {cycleKind === 'hot-water' || cycleKind === 'steam' ? <HeatCaution /> : null}
      {cycleKind === 'chemical' ? <ChemicalCaution /> : null}
      <FormField label="What was done" htmlFor="cycle-kind" error={errors.kind?.message}>
        <Select id="cycle-kind" {...form.register('kind')} options={CYCLE_KINDS.map((k) => ({ value: k, label: cycleKindLabels[k] }))} />
      </FormField>
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField
          label="Temperature"
          htmlFor="cycle-temp"
          error={errors.tempC?.message}
          hint={
            <>
              {target.typeName} is rated to {units.format('temperature', target.maxTempC, 0)} at most.
              {hint.text ? <span className="mt-0.5 block">{hint.text}</span> : null}
            </>
          }
        >
          <NumberInput id="cycle-temp" unit={units.symbol('temperature')} {...form.register('tempC')} />
        </FormField>
        <FormField label="Duration" htmlFor="cycle-duration" error={errors.durationMin?.message}>
          <NumberInput id="cycle-duration" unit="min" {...form.register('durationMin')} />
        </FormField>
      </div>
      {aboveRating ? (
        <label className="flex items-start gap-2 rounded border border-watch-200 bg-watch-50 px-4 py-3 text-base text-ink-900">
          <input type="checkbox" className="mt-1 size-5" {...form.register('aboveRatingConfirmed')} />
          <span>
            It really ran above the {units.format('temperature', target.maxTempC, 0)} rating. Record it anyway: it is flagged on the cartridge, counts in its life, and the
            cartridge should pass an integrity test before use.
          </span>
        </label>
      ) : null}
      {cycleKind === 'chemical' ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Cleaning agent" htmlFor="cycle-agent" error={errors.agent?.message} required>
            <Input id="cycle-agent" list="cycle-agents" placeholder="e.g. caustic soda" {...form.register('agent')} />
          </FormField>
          <datalist id="cycle-agents">
            <option value="Caustic soda (NaOH)" />
            <option value="Caustic potash (KOH)" />
            <option value="Citric acid" />
            <option value="Peracetic acid" />
            <option value="Enzymatic cleaner" />
          </datalist>
          <FormField label="Concentration" htmlFor="cycle-conc" error={errors.concentrationPct?.message}>
            <NumberInput id="cycle-conc" unit="%" {...form.register('concentrationPct')} />
          </FormField>
        </div>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField label="Clean-water flow before" htmlFor="cycle-before" error={errors.waterFlowBeforeLh?.message}>
          <NumberInput id="cycle-before" unit={units.symbol('flow')} {...form.register('waterFlowBeforeLh')} />
        </FormField>
        <FormField label="Clean-water flow after" htmlFor="cycle-after" error={errors.waterFlowAfterLh?.message} hint="At the same ΔP as before.">
          <NumberInput id="cycle-after" unit={units.symbol('flow')} {...form.register('waterFlowAfterLh')} />
        </FormField>
        <FormField label="Water temperature" htmlFor="cycle-water-temp" error={errors.waterTempC?.message} hint="Flows are brought to 20 °C water (colder water flows less).">
          <NumberInput id="cycle-water-temp" unit={units.symbol('temperature')} {...form.register('waterTempC')} />
        </FormField>
        <FormField
          label="ΔP during the flow measurement"
          htmlFor="cycle-flow-dp"
          error={errors.flowDpBar?.message}
          hint={`The type’s clean-water flow is given at ${units.format('dp', target.waterDpBar)}; flows are brought to that ΔP (flow rises in step with ΔP).`}
        >
          <NumberInput id="cycle-flow-dp" unit={units.symbol('dp')} {...form.register('flowDpBar')} />
        </FormField>
        {target.housingElementEquivalents !== null ? (
          <FormField label="Flows measured for" htmlFor="cycle-flow-basis" error={errors.flowBasis?.message}>
            <Select
              id="cycle-flow-basis"
              {...form.register('flowBasis')}
              options={[
                { value: 'cartridge', label: 'This cartridge alone' },
                { value: 'housing', label: `The whole housing (${target.housingName ?? 'its housing'})` },
              ]}
            />
          </FormField>
        ) : null}
      </div>
      <div aria-live="polite" className="text-base">
        {recovery ? (
          <p className="flex flex-wrap items-center gap-2">
            <span>
              Flow recovery <Quantity value={recovery.pct} unit="%" digits={0} className="font-semibold" />{' '}
              {recovery.basis === 'new'
                ? 'of the as-new flow'
                : recovery.basis === 'spec'
                  ? 'of the type’s clean-water flow for this length'
                  : recovery.basis === 'first-after'
                    ? 'of the first flow logged'
                    : 'of the flow before (no as-new flow known)'}
              {target.flowBasis ? (
                <span className="text-ink-600"> ({units.format('flow', target.flowBasis.flowLh)})</span>
              ) : null}
            </span>
            {recovery.basis !== 'before' ? (
              recovery.pct >= recovery.minPct ? (
                <StatusBadge tone="ok" size="sm">above the {recovery.minPct} % floor</StatusBadge>
              ) : (
                <StatusBadge tone="watch" size="sm">below the {recovery.minPct} % floor</StatusBadge>
              )
            ) : null}
          </p>
        ) : (
          <p className="text-sm text-ink-600">Enter the flow after to see the recovery.</p>
        )}
        {recovery?.suspect ? (
          <p className="mt-1 text-base text-watch-800">
            Above 105 % of the basis: was the whole housing’s flow entered as this cartridge’s? Choose “The whole housing” or check the reading.
          </p>
        ) : null}
      </div>
      <FormField label="When" htmlFor="cycle-at" error={errors.at?.message}>
        <Input id="cycle-at" type="datetime-local" {...form.register('at')} />
      </FormField>
      <SaveOutcome kept={kept} alert={alert} />
      <Button type="submit" size="lg" loading={log.isPending} className="w-full sm:w-auto">
        Save cycle
      </Button>
    </form>
  );
}
