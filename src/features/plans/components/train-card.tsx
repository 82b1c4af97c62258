import { CircleCheck, OctagonX, Plus, Save, Sparkles, Trash2, TriangleExclamationPoint, X } from 'lucide-react';
import { useEffect, useId, useMemo, useState } from 'react';
import { CLEAN_DP_MAX_FRACTION_OF_TERMINAL, COST_VOLUME_BASIS, costPerVolumeBasis, suggestTrain, type SizingHousing, type SizingWarning, type StageSizing, type TrainSizingResult } from '@shared/engine';
import { buildTrainSizingInput, sizePlanTrain, type TrainSizingOutcome } from '@shared/adapters/plans';
import {
  BLOCKING_WARNING_CODES,
  STAGES_MAX,
  type TrainStageInput,
} from '@shared/schemas/plans';
import type { PlanDto, PlanLotDto, PlanTrainDto } from '@shared/types/plans';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input, NumberInput } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { cn } from '@/utils/cn';
import { useDeleteTrain } from '../api/delete-train';
import { useUpdatePlanLot } from '../api/update-plan-lot';
import { useUpdateTrain } from '../api/update-train';
import { parseNumberText } from '@/lib/number-input';
import { CapacitySource } from './capacity-source';
import { HosesEditor, toDraftHoses, toHoses, type DraftHose } from './hoses-editor';

/** A stage as typed: text fields stay text until sized or saved. */
type DraftStage = { name: string; cartridgeTypeId: string; housingId: string; housingCount: string; capacity: string };

type Units = ReturnType<typeof useUnits>;

/** Capacity per m² as shown in the person's units (L/m² or gal/ft²). */
const capacityText = (v: number | null, u: Units) => (v === null ? '' : u.toInput('loading', v));

const toDraft = (t: PlanTrainDto, u: Units): DraftStage[] =>
  t.stages.map((s) => ({
    name: s.name ?? '',
    cartridgeTypeId: s.cartridgeTypeId,
    housingId: s.housingId,
    housingCount: String(s.housingCount),
    capacity: capacityText(s.capacityLPerM2, u),
  }));

const parseNumber = (text: string) => parseNumberText(text) ?? undefined;

/** Stages to size or save; a capacity left as shown keeps its stored value exactly (no rounding back from gal/ft²). */
const toStages = (draft: DraftStage[], t: PlanTrainDto, u: Units): TrainStageInput[] =>
  draft.map((d, i) => {
    const stored = t.stages[i]?.capacityLPerM2 ?? null;
    const typed = parseNumber(d.capacity);
    const capacity = stored !== null && d.capacity === capacityText(stored, u) ? stored : typed === undefined || !Number.isFinite(typed) ? typed : u.fromInput('loading', typed);
    return {
      ...(d.name.trim() ? { name: d.name.trim() } : {}),
      cartridgeTypeId: d.cartridgeTypeId,
      housingId: d.housingId,
      housingCount: Number(d.housingCount.trim() || '1'),
      capacityLPerM2: capacity === undefined ? null : capacity,
    };
  });

const interventionWords = (s: StageSizing) => {
  if (s.interventionKind === null) return 'unknown without a capacity';
  if (s.interventionKind === 'none') return 'none: one set lasts the lot';
  const parts: string[] = [];
  if (s.regenerations) parts.push(`${s.regenerations} regeneration${s.regenerations === 1 ? '' : 's'}`);
  if (s.changes) parts.push(`${s.changes} change${s.changes === 1 ? '' : 's'}`);
  return parts.join(' and ');
};

const money = (v: number | null, currency: string | null) =>
  v === null ? '—' : new Intl.NumberFormat(undefined, { style: 'currency', currency: currency ?? 'EUR', maximumFractionDigits: 2 }).format(v);

/** A cost per hL in the person's units: per hL, or per 100 gal in US customary. */
const costPer = (v: number | null, u: Units) => (v === null ? null : costPerVolumeBasis(v, u.system).value);

function Figure({ label, children, tone, testId }: { label: string; children: React.ReactNode; tone?: 'ok' | 'over'; testId?: string }) {
  return (
    <div className="flex items-baseline justify-between gap-2 border-b border-ink-100 py-1 last:border-0 max-sm:flex-col max-sm:items-start max-sm:gap-0 max-sm:border-0" data-testid={testId}>
      <dt className="text-sm text-ink-600 max-sm:text-xs">{label}</dt>
      <dd className={cn('num text-right text-sm font-semibold max-sm:text-left', tone === 'over' ? 'text-stop-700' : 'text-ink-900')}>
        {tone === 'over' ? <OctagonX aria-hidden="true" className="mr-1 inline size-3.5 align-[-2px]" /> : null}
        {children}
      </dd>
    </div>
  );
}

/** "⅓" for the engine's clean-ΔP share of terminal, else the percentage. */
const fractionWords = Math.abs(CLEAN_DP_MAX_FRACTION_OF_TERMINAL - 1 / 3) < 1e-9 ? '⅓' : `${Math.round(CLEAN_DP_MAX_FRACTION_OF_TERMINAL * 100)} % of`;

/** The engine's figures for one stage, in the person's units. */
function StageFigures({ s }: { s: StageSizing }) {
  const u = useUnits();
  const third = s.terminalDpBar * CLEAN_DP_MAX_FRACTION_OF_TERMINAL;
  const dpShare = Math.min(1, s.cleanDpBar / s.terminalDpBar);
  // On a phone the stage's limits stand in one line; every figure opens on a tap.
  const [open, setOpen] = useState(false);
  const over = s.fluxLhPer10in > s.designFluxLhPer10in || s.cleanDpBar > third || s.infeasible;
  return (
    <>
      <button
        type="button"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className={cn('num mt-2 flex min-h-11 w-full items-center justify-between gap-2 rounded border border-ink-200 bg-ink-50 px-2.5 text-left text-sm sm:hidden', over ? 'text-stop-700' : 'text-ink-800')}
      >
        <span>
          {over ? <OctagonX aria-hidden="true" className="mr-1 inline size-3.5 align-[-2px]" /> : null}
          {u.format('flow', s.fluxLhPer10in)} of {u.format('flow', s.designFluxLhPer10in)} · ΔP {u.format('dp', s.cleanDpBar)} of {u.format('dp', third)}
          {s.capacityL !== null && !s.infeasible ? ` · ${u.format('volume', s.capacityL)}` : ''}
        </span>
        <span className="shrink-0 text-xs font-semibold text-primary-700">{open ? 'Fewer' : 'All figures'}</span>
      </button>
      <dl className={cn('mt-2 rounded border border-ink-200 bg-ink-50 px-2.5 py-1.5 max-sm:grid max-sm:grid-cols-2 max-sm:gap-x-3', !open && 'max-sm:hidden')}>
        <Figure label="10-inch equivalents" testId="stage-equivalents">
          {s.elementEquivalents} <span className="font-normal text-ink-600">({s.cartridgeCount} cartridges)</span>
        </Figure>
        <Figure label="Flux per 10-inch" tone={s.fluxLhPer10in > s.designFluxLhPer10in ? 'over' : 'ok'} testId="stage-flux">
          {u.format('flow', s.fluxLhPer10in)} <span className="font-normal text-ink-600">of {u.format('flow', s.designFluxLhPer10in)}</span>
        </Figure>
        <Figure label="Clean ΔP" tone={s.cleanDpBar > third ? 'over' : 'ok'} testId="stage-dp">
          {u.format('dp', s.cleanDpBar)} <span className="font-normal text-ink-600">of {u.format('dp', third)}<span className="max-sm:hidden"> ({fractionWords} terminal)</span></span>
        </Figure>
        <div aria-hidden="true" className="relative my-1 h-1.5 rounded-full bg-ink-200 max-sm:hidden">
          <div className={cn('h-1.5 rounded-full', s.cleanDpBar > third ? 'bg-stop-600' : 'bg-primary-600')} style={{ width: `${Math.max(2, dpShare * 100)}%` }} />
          <div className="absolute inset-y-[-2px] w-px bg-ink-700" style={{ left: `${CLEAN_DP_MAX_FRACTION_OF_TERMINAL * 100}%` }} />
        </div>
        <Figure label="To terminal ΔP" testId="stage-capacity">
          {s.infeasible ? (
            <span className="text-stop-700">none: clean ΔP already at terminal</span>
          ) : s.capacityL === null ? (
            <span className="font-normal text-ink-600">unknown</span>
          ) : (
            <>
              {u.format('volume', s.capacityL)}
              <CapacitySource s={s} />
            </>
          )}
        </Figure>
        <Figure label="Regenerations or changes" testId="stage-interventions">
          <span className="font-normal">{interventionWords(s)}</span>
        </Figure>
        <Figure label={`Cost per ${COST_VOLUME_BASIS[u.system].per}`} testId="stage-cost">
          {s.costIsLowerBound ? 'at least ' : ''}
          {money(costPer(s.costPerHl, u), s.currency)}
          {s.costBasis === 'service-life' ? <span className="font-normal text-ink-600 max-sm:hidden"> (set spread over its life)</span> : null}
          {s.costBasis === 'whole-set' ? <span className="font-normal text-ink-600 max-sm:hidden"> (whole set: no rated cycles)</span> : null}
        </Figure>
      </dl>
    </>
  );
}

function Warnings({ warnings }: { warnings: SizingWarning[] }) {
  if (warnings.length === 0) {
    return (
      <p className="flex items-center gap-1.5 text-sm text-ok-700">
        <CircleCheck aria-hidden="true" className="size-4" /> No limit broken.
      </p>
    );
  }
  return (
    <ul className="flex flex-col gap-1" aria-label="Warnings">
      {warnings.map((w, i) => {
        const blocking = BLOCKING_WARNING_CODES.includes(w.code);
        const Icon = blocking ? OctagonX : TriangleExclamationPoint;
        return (
          <li key={i} className={cn('flex gap-1.5 text-sm', blocking ? 'text-stop-700' : 'text-watch-800')}>
            <Icon aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
            <span>
              <span className="font-semibold">{blocking ? 'Stops approval: ' : 'Watch: '}</span>
              {w.message}
            </span>
          </li>
        );
      })}
    </ul>
  );
}

function Totals({ r }: { r: TrainSizingResult }) {
  const u = useUnits();
  const minutes = Math.round(r.totals.runHours * 60);
  return (
    <dl className="rounded border border-ink-200 px-2.5 py-1.5 max-sm:grid max-sm:grid-cols-2 max-sm:gap-x-3" data-testid="train-totals">
      <Figure label="Flow">{u.format('flow', r.flowLh)}</Figure>
      <Figure label="Run time">{`${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`}</Figure>
      <Figure label="Pump pressure, clean → end">
        {u.format('pressure', r.totals.pumpPressureCleanBar)} → {u.format('pressure', r.totals.pumpPressureEndOfRunBar)}
      </Figure>
      <Figure label="Line loss (hoses)" testId="train-line-loss">
        {u.format('dp', r.totals.lineLossBar)}
      </Figure>
      <Figure label="Hold-up">{u.format('volume', r.totals.holdUpL, 1)}</Figure>
      <Figure label={`Cost per ${COST_VOLUME_BASIS[u.system].per}, train`} testId="train-cost">
        {r.totals.costIsLowerBound && r.totals.costPerHl !== null ? 'at least ' : ''}
        {money(costPer(r.totals.costPerHl, u), r.totals.currency)}
        {r.totals.unpricedStages.length > 0 && r.totals.costPerHl !== null ? <span className="font-normal text-ink-600"> (priced stages only)</span> : null}
      </Figure>
    </dl>
  );
}

export interface TrainCardProps {
  plan: PlanDto;
  planLot: PlanLotDto;
  train: PlanTrainDto;
  editable: boolean;
  /** Hears the live sizing and whether there are unsaved edits, so the lot can compare its options. */
  onSized?: (trainId: string, live: { name: string; outcome: TrainSizingOutcome; dirty: boolean }) => void;
  /** Extra classes for the card (e.g. hidden on a phone when another option is shown). */
  className?: string;
}

/**
 * One train option: stages picked from the catalogue, sized live in the browser by the engine as
 * the person edits (no request per keystroke), saved with "Save train".
 */
export function TrainCard({ plan, planLot, train, editable, onSized, className }: TrainCardProps) {
  const id = useId();
  const toast = useToast();
  const save = useUpdateTrain();
  const remove = useDeleteTrain();
  const choose = useUpdatePlanLot();
  const { cartridgeTypes, housings } = plan.catalogue;
  const [name, setName] = useState(train.name);
  const u = useUnits();
  const [draft, setDraft] = useState<DraftStage[]>(() => toDraft(train, u));
  const [suggestNote, setSuggestNote] = useState<string | null>(null);
  const [hoseDraft, setHoseDraft] = useState<DraftHose[]>(() => toDraftHoses(train.hoses, u));
  const saved = JSON.stringify({ n: train.name, s: toDraft(train, u), h: toDraftHoses(train.hoses, u) });
  useEffect(() => {
    setName(train.name);
    setDraft(toDraft(train, u));
    setHoseDraft(toDraftHoses(train.hoses, u));
  }, [saved]);
  const dirty = saved !== JSON.stringify({ n: name, s: draft, h: hoseDraft });
  const chosen = planLot.chosenTrainId === train.id;

  const stages = useMemo(() => toStages(draft, train, u), [draft, train, u.system]);
  const hoses = useMemo(() => toHoses(hoseDraft, train.hoses, u), [hoseDraft, train.hoses, u.system]);
  const source = { wine: planLot.lot, volumeL: planLot.volumeL, line: plan.line, stages, types: cartridgeTypes, housings, hoses, sanitationKind: plan.sanitationKind };
  const sized = useMemo(
    () => sizePlanTrain(source),
    [stages, planLot.volumeL, planLot.lot, plan.line, cartridgeTypes, housings, hoses, plan.sanitationKind],
  );

  useEffect(() => onSized?.(train.id, { name, outcome: sized, dirty }), [sized, dirty, name]);

  const setStage = (i: number, patch: Partial<DraftStage>) => setDraft((d) => d.map((s, k) => (k === i ? { ...s, ...patch } : s)));

  const suggest = () => {
    setSuggestNote(null);
    const filled = stages.map((s) => ({ ...s, housingId: s.housingId || housings[0]?.id || '' }));
    const built = buildTrainSizingInput({ ...source, stages: filled });
    if (!built.ok) return setSuggestNote(built.error);
    const options: SizingHousing[] = housings.map((h) => ({ id: h.id, rounds: h.rounds, lengthIn: h.lengthIn as SizingHousing['lengthIn'], maxPressureBar: h.maxPressureBar, maxTempC: h.maxTempC, holdUpL: h.holdUpL }));
    const idOf = new Map(options.map((o, k) => [o, housings[k].id]));
    try {
      const out = suggestTrain(built.input, { housingOptions: options });
      if (!out.ok) return setSuggestNote(out.reason);
      setDraft((d) => d.map((s, k) => ({ ...s, housingId: out.input.stages[k].housingId ?? idOf.get(out.input.stages[k].housing) ?? s.housingId, housingCount: String(out.input.stages[k].housingCount ?? 1) })));
      setSuggestNote('Smallest housing sets that meet every limit. Save the train to keep them.');
    } catch (error) {
      setSuggestNote(error instanceof RangeError ? error.message : 'No suggestion could be made.');
    }
  };

  const onSave = async () => {
    try {
      await save.mutateAsync({ planId: plan.id, planLotId: planLot.id, trainId: train.id, changes: { name, stages, hoses: hoses.length > 0 ? hoses : null } });
      toast.success(`${name} saved`);
    } catch (error) {
      toast.error('The train was not saved', errorMessage(error, { preferField: true }));
    }
  };

  const typeOptions = cartridgeTypes.map((t) => ({ value: t.id, label: `${t.name} (${t.kind}, ${t.ratingUm} µm)` }));
  const housingOptions = housings.map((h) => ({ value: h.id, label: `${h.name} (${h.rounds} × ${h.lengthIn} in)` }));

  return (
    <article
      aria-label={`${planLot.lot.code}: ${train.name}`}
      className={cn('flex w-[min(24rem,calc(100vw-3rem))] shrink-0 snap-start flex-col gap-3 rounded border bg-white p-3 max-sm:w-full', chosen ? 'border-primary-600 ring-1 ring-primary-600' : 'border-ink-200', className)}
    >
      <div className="flex items-start justify-between gap-2">
        {editable ? (
          <Input aria-label="Train name" value={name} onChange={(e) => setName(e.target.value)} className="font-semibold" />
        ) : (
          <h4 className="text-base font-semibold text-ink-950">{train.name}</h4>
        )}
        {chosen ? (
          <StatusBadge tone="ok" className="mt-2">
            chosen
          </StatusBadge>
        ) : null}
      </div>

      <ol className="flex flex-col gap-3">
        {draft.map((d, i) => {
          const s = sized.ok ? sized.result.stages[i] : null;
          return (
            <li key={i} className="rounded border border-ink-200 p-2.5 max-sm:p-2" aria-label={`Stage ${i + 1}`}>
              <div className="mb-2 flex items-center justify-between gap-2">
                <span className="text-sm font-semibold text-ink-800">
                  Stage {i + 1}
                  {s ? <span className="font-normal text-ink-600"> · {s.kind}, {s.ratingUm} µm</span> : null}
                </span>
                {editable && draft.length > 1 ? (
                  <Button variant="ghost" size="sm" icon={<X />} aria-label={`Remove stage ${i + 1}`} onClick={() => setDraft((x) => x.filter((_, k) => k !== i))}>
                    Remove
                  </Button>
                ) : null}
              </div>
              {!editable ? (
                <p className="text-sm text-ink-800 sm:hidden" data-testid="stage-read-only">
                  {typeOptions.find((o) => o.value === d.cartridgeTypeId)?.label ?? 'No type'} · {d.housingCount} × {housingOptions.find((o) => o.value === d.housingId)?.label ?? 'no housing'}
                  {d.capacity ? ` · ${d.capacity} ${u.symbol('loading')}` : ''}
                </p>
              ) : null}
              <div className={cn('grid grid-cols-1 gap-2', !editable && 'max-sm:hidden')}>
                <FormField label="Cartridge type" htmlFor={`${id}-t${i}`}>
                  <Select id={`${id}-t${i}`} disabled={!editable} value={d.cartridgeTypeId} placeholder="Choose a type" options={typeOptions} onChange={(e) => setStage(i, { cartridgeTypeId: e.target.value })} />
                </FormField>
                <FormField label="Housing" htmlFor={`${id}-h${i}`}>
                  <Select id={`${id}-h${i}`} disabled={!editable} value={d.housingId} placeholder="Choose a housing" options={housingOptions} onChange={(e) => setStage(i, { housingId: e.target.value })} />
                </FormField>
                <div className="grid grid-cols-2 gap-2">
                  <FormField label="Housings in parallel" htmlFor={`${id}-n${i}`}>
                    <NumberInput id={`${id}-n${i}`} disabled={!editable} value={d.housingCount} onChange={(e) => setStage(i, { housingCount: e.target.value })} />
                  </FormField>
                  <FormField label="Capacity" htmlFor={`${id}-c${i}`}>
                    <NumberInput id={`${id}-c${i}`} unit={u.symbol('loading')} placeholder={s?.capacitySource === 'past-runs' ? 'past runs' : s?.capacitySource === 'vmax' ? 'Vmax test' : s?.capacitySource === 'nominal' ? 'nominal' : 'unknown'} disabled={!editable} value={d.capacity} onChange={(e) => setStage(i, { capacity: e.target.value })} />
                  </FormField>
                </div>
              </div>
              {s ? <StageFigures s={s} /> : null}
            </li>
          );
        })}
      </ol>

      <HosesEditor id={`${id}-hoses`} draft={hoseDraft} setDraft={setHoseDraft} editable={editable} units={u} />

      {sized.ok ? (
        <>
          <Totals r={sized.result} />
          <Warnings warnings={sized.result.warnings} />
        </>
      ) : (
        <p role="status" className="flex gap-1.5 text-sm text-watch-800">
          <TriangleExclamationPoint aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
          {sized.error}
        </p>
      )}
      {suggestNote ? <p className="text-sm text-ink-700">{suggestNote}</p> : null}

      {editable ? (
        <div className="flex flex-wrap gap-2 border-t border-ink-200 pt-3 max-sm:[&_button]:min-h-11">
          <Button onClick={onSave} loading={save.isPending} disabled={!dirty} icon={<Save />}>
            Save train
          </Button>
          <Button
            variant="secondary"
            icon={<CircleCheck />}
            disabled={chosen || dirty}
            title={dirty ? 'Save the changes first' : undefined}
            loading={choose.isPending}
            onClick={() =>
              choose.mutate(
                { planId: plan.id, planLotId: planLot.id, changes: { chosenTrainId: train.id } },
                { onError: (e) => toast.error('Not chosen', errorMessage(e)) },
              )
            }
          >
            {chosen ? 'Chosen' : 'Choose this train'}
          </Button>
          <Button variant="ghost" icon={<Sparkles />} onClick={suggest}>
            Suggest housings
          </Button>
          {draft.length < STAGES_MAX ? (
            <Button
              variant="ghost"
              icon={<Plus />}
              onClick={() => setDraft((x) => [...x, { name: '', cartridgeTypeId: '', housingId: '', housingCount: '1', capacity: '' }])}
            >
              Add stage
            </Button>
          ) : null}
          <Button
            variant="ghost"
            icon={<Trash2 />}
            loading={remove.isPending}
            aria-label={`Delete ${train.name}`}
            onClick={() => remove.mutate({ planId: plan.id, planLotId: planLot.id, trainId: train.id }, { onError: (e) => toast.error('Not deleted', errorMessage(e)) })}
          >
            Delete
          </Button>
          {dirty ? <p className="w-full text-sm text-watch-800">Unsaved changes: the figures above are live, the plan keeps the saved train.</p> : null}
        </div>
      ) : null}
    </article>
  );
}
