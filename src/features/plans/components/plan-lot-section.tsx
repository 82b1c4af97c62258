import { ArrowDown, ArrowUp, Plus, Trash2 } from 'lucide-react';
import { useCallback, useEffect, useId, useState } from 'react';
import type { TrainStageInput } from '@shared/schemas/plans';
import type { TrainSizingOutcome } from '@shared/adapters/plans';
import type { PlanDto, PlanLotDto } from '@shared/types/plans';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { NumberInput } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { useCreateTrain } from '../api/create-train';
import { useRemovePlanLot } from '../api/remove-plan-lot';
import { useUpdatePlanLot } from '../api/update-plan-lot';
import { OptionComparison, OptionSwitcher, type ComparedOption } from './option-comparison';
import { TrainCard } from './train-card';
import { parseNumberText } from '@/lib/number-input';

const letter = (n: number) => String.fromCharCode(65 + (n % 26));

/** The first train of a lot: a prefilter then a membrane from the catalogue; later ones copy the last. */
function startingStages(plan: PlanDto, lot: PlanLotDto): TrainStageInput[] {
  const last = lot.trains.at(-1);
  if (last) return last.stages.map((s) => ({ ...s }));
  const { cartridgeTypes: types, housings } = plan.catalogue;
  const pre = types.find((t) => t.kind === 'prefilter');
  const mem = types.find((t) => t.kind === 'membrane');
  // A housing named for its kind serves that kind; never the same housing for both stages.
  const named = (word: string) => housings.find((h) => h.name.toLowerCase().includes(word));
  const hPre = (named('prefilter') ?? housings[0])?.id ?? '';
  const hMem = (named('membrane') ?? housings.find((h) => h.id !== hPre) ?? housings[0])?.id ?? '';
  const stages: TrainStageInput[] = [];
  if (pre) stages.push({ name: 'Prefilter', cartridgeTypeId: pre.id, housingId: hPre, housingCount: 1 });
  if (mem) stages.push({ name: 'Membrane', cartridgeTypeId: mem.id, housingId: pre ? (hMem !== hPre ? hMem : (housings.find((h) => h.id !== hPre)?.id ?? hMem)) : hMem, housingCount: 1 });
  return stages;
}

/** One lot of the day: its place, the volume to bottle and its train options side by side. */
export function PlanLotSection({ plan, planLot, editable, isFirst, isLast }: { plan: PlanDto; planLot: PlanLotDto; editable: boolean; isFirst: boolean; isLast: boolean }) {
  const id = useId();
  const units = useUnits();
  const toast = useToast();
  const update = useUpdatePlanLot();
  const remove = useRemovePlanLot();
  const create = useCreateTrain();
  const [volume, setVolume] = useState(units.toInput('volume', planLot.volumeL, 1));
  const [volumeError, setVolumeError] = useState<string | null>(null);
  useEffect(() => setVolume(units.toInput('volume', planLot.volumeL, 1)), [planLot.volumeL, units.system]);

  const saveVolume = () => {
    const typed = parseNumberText(volume) ?? Number.NaN;
    if (!volume.trim() || !(typed > 0)) return setVolumeError('Enter the volume to bottle, more than 0.');
    setVolumeError(null);
    const litres = units.fromInput('volume', typed);
    if (Math.abs(litres - planLot.volumeL) < 1e-6) return;
    update.mutate(
      { planId: plan.id, planLotId: planLot.id, changes: { volumeL: litres } },
      { onError: (e) => setVolumeError(errorMessage(e, { preferField: true })) },
    );
  };
  const move = (position: number) =>
    update.mutate({ planId: plan.id, planLotId: planLot.id, changes: { position } }, { onError: (e) => toast.error('Not moved', errorMessage(e)) });
  const addTrain = () => {
    const stages = startingStages(plan, planLot);
    if (stages.length === 0) return toast.error('No cartridge types yet', 'Add cartridge types and housings under Equipment first.');
    create.mutate(
      { planId: plan.id, planLotId: planLot.id, input: { name: `Option ${letter(planLot.trains.length)}`, stages } },
      { onError: (e) => toast.error('The train was not added', errorMessage(e, { preferField: true })) },
    );
  };
  const l = planLot.lot;

  // Each option's live sizing (reported by its card while edited), for the comparison.
  const [live, setLive] = useState<Record<string, { name: string; outcome: TrainSizingOutcome; dirty: boolean }>>({});
  const onSized = useCallback((trainId: string, v: { name: string; outcome: TrainSizingOutcome; dirty: boolean }) => setLive((m) => ({ ...m, [trainId]: v })), []);
  // On a phone one option is shown at a time: the one picked, else the chosen one, else the first.
  const [picked, setPicked] = useState<string | null>(null);
  const shown = planLot.trains.find((t) => t.id === picked)?.id ?? planLot.chosenTrainId ?? planLot.trains[0]?.id ?? '';
  const compared: ComparedOption[] = planLot.trains.map((t) => {
    const v = live[t.id];
    return {
      train: t,
      name: v?.name ?? t.name,
      outcome: v?.outcome ?? (t.sizing ? null : { ok: false, error: t.sizingError ?? 'Not sized.' }),
      dirty: v?.dirty ?? false,
      chosen: planLot.chosenTrainId === t.id,
    };
  });

  return (
    <Card
      level={3}
      title={
        <span>
          <span className="num text-ink-500">{planLot.position}.</span> {l.code} · {l.name}
        </span>
      }
      description={`${units.format('volume', l.volumeL)} in the cellar · ${units.format('temperature', l.tempC)} · ${l.ethanolPctVol} % vol · ${l.sugarGPerL} g/L sugar`}
      actions={
        editable ? (
          <>
            <Button variant="ghost" size="sm" className="max-sm:min-h-11" icon={<ArrowUp />} disabled={isFirst || update.isPending} aria-label={`Move ${l.code} up`} onClick={() => move(planLot.position - 1)}>
              Up
            </Button>
            <Button variant="ghost" size="sm" className="max-sm:min-h-11" icon={<ArrowDown />} disabled={isLast || update.isPending} aria-label={`Move ${l.code} down`} onClick={() => move(planLot.position + 1)}>
              Down
            </Button>
            <Button
              variant="ghost"
              size="sm"
              className="max-sm:min-h-11"
              icon={<Trash2 />}
              aria-label={`Remove ${l.code} from the plan`}
              loading={remove.isPending}
              onClick={() => remove.mutate({ planId: plan.id, planLotId: planLot.id }, { onError: (e) => toast.error('Not removed', errorMessage(e)) })}
            >
              Remove
            </Button>
          </>
        ) : null
      }
    >
      <div className="flex flex-col gap-3">
        <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
          <FormField label="Volume to bottle" htmlFor={`${id}-vol`} error={volumeError} className="sm:w-56">
            <NumberInput
              id={`${id}-vol`}
              unit={units.symbol('volume')}
              value={volume}
              readOnly={!editable}
              onChange={(e) => setVolume(e.target.value)}
              onBlur={editable ? saveVolume : undefined}
              onKeyDown={(e) => {
                if (e.key === 'Enter') saveVolume();
              }}
            />
          </FormField>
          {!planLot.chosenTrainId ? <p className="text-sm text-watch-800 sm:pb-3">No train chosen yet.</p> : null}
        </div>
        {planLot.trains.length > 1 ? (
          <>
            <p className="text-sm text-ink-600">
              <span className="max-sm:hidden">{planLot.trains.length} trains side by side: compare, then choose one.</span>
              <span className="sm:hidden">{planLot.trains.length} trains: one is shown at a time; tap another to see it.</span>
            </p>
            <OptionComparison options={compared} lotCode={l.code} />
            <OptionSwitcher options={compared} active={shown} onChoose={setPicked} lotCode={l.code} />
          </>
        ) : null}
        <div className="-mx-1 flex snap-x gap-3 overflow-x-auto px-1 pb-2" role="group" aria-label={`Trains for ${l.code}`}>
          {planLot.trains.map((t) => (
            <TrainCard key={t.id} plan={plan} planLot={planLot} train={t} editable={editable} onSized={onSized} className={t.id === shown ? undefined : 'max-sm:hidden'} />
          ))}
          {planLot.trains.length === 0 ? (
            <p className="text-sm text-ink-600">{editable ? 'No train yet: add one and pick its stages.' : 'No train yet.'}</p>
          ) : null}
        </div>
        {editable ? (
          <div>
            <Button variant="secondary" icon={<Plus />} loading={create.isPending} onClick={addTrain}>
              {planLot.trains.length === 0 ? 'Add a train' : 'Add train option'}
            </Button>
          </div>
        ) : null}
      </div>
    </Card>
  );
}
