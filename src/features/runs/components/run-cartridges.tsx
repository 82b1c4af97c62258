import { Repeat } from 'lucide-react';
import { useState, type FormEvent } from 'react';
import type { RunDetailDto, RunStageDto } from '@shared/types/runs';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { FormMessage } from '@/components/ui/form-message';
import { NumberInput } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useChangeRunCartridges } from '../api/run-changes';
import { useStockCartridges } from '../api/get-stock-cartridges';

const parse = (s: string): number | null => {
  const t = s.trim().replace(',', '.');
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
};

function ChangeDialog({ run, onClose }: { run: RunDetailDto; onClose: () => void }) {
  const units = useUnits();
  const toast = useToast();
  const change = useChangeRunCartridges();
  const [stageIndex, setStageIndex] = useState(0);
  const [kind, setKind] = useState<'change' | 'regeneration'>('change');
  const [cycleKind, setCycleKind] = useState<'hot-water' | 'steam' | 'chemical' | 'backflush'>('hot-water');
  const [volume, setVolume] = useState(units.toInput('volume', run.currentVolumeL, 0));
  const [out, setOut] = useState<string[]>([]);
  const [into, setInto] = useState<string[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const stage = run.stages[stageIndex];
  const inNow = stage.cartridges.filter((c) => c.removedAtVolumeL === null);
  const stock = useStockCartridges(kind === 'change');
  const toggle = (list: string[], id: string) => (list.includes(id) ? list.filter((x) => x !== id) : [...list, id]);

  function submit(e: FormEvent) {
    e.preventDefault();
    const v = parse(volume);
    if (v === null) {
      setErrors({ atVolumeL: 'Enter the litres through the train at the change.' });
      return;
    }
    setErrors({});
    setFormError(null);
    change.mutate(
      {
        runId: run.id,
        input: { stageIndex, atVolumeL: units.fromInput('volume', v), removedCartridgeIds: out, installedCartridgeIds: kind === 'change' ? into : [], kind, cycleKind },
      },
      {
        onSuccess: () => {
          toast.success(kind === 'change' ? 'Cartridge change recorded' : 'Regeneration recorded');
          onClose();
        },
        onError: (err) => {
          if (err instanceof ApiError && Object.keys(err.fields).length) setErrors(err.fields);
          setFormError(errorMessage(err));
        },
      },
    );
  }

  return (
    <Dialog
      open
      onClose={onClose}
      size="lg"
      title="Change cartridges"
      description="Record which cartridges came out and which went in, at how many litres through the train. Each cartridge is credited with exactly the litres it carried."
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form="run-change-form" disabled={change.isPending}>
            Record {kind === 'change' ? 'change' : 'regeneration'}
          </Button>
        </>
      }
    >
      <form id="run-change-form" className="flex flex-col gap-4" onSubmit={submit} noValidate>
        <FormMessage message={formError} />
        <p className="text-base font-semibold text-watch-700">Depressurise and drain the housing before opening it.</p>
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <FormField label="Stage" htmlFor="change-stage">
            <Select
              id="change-stage"
              value={String(stageIndex)}
              onChange={(e) => {
                setStageIndex(Number(e.target.value));
                setOut([]);
                setInto([]);
              }}
              options={run.stages.map((s) => ({ value: String(s.index), label: `${String(s.index + 1)}. ${s.name} · ${s.housingName}` }))}
            />
          </FormField>
          <FormField label="What happened" htmlFor="change-kind">
            <Select
              id="change-kind"
              value={kind}
              onChange={(e) => setKind(e.target.value as 'change' | 'regeneration')}
              options={[
                { value: 'change', label: 'Cartridges changed' },
                { value: 'regeneration', label: 'Regenerated in place' },
              ]}
            />
          </FormField>
          <FormField label="Litres through the train at the change" htmlFor="change-volume" error={errors.atVolumeL}>
            <NumberInput id="change-volume" unit={units.symbol('volume')} value={volume} onChange={(e) => setVolume(e.target.value)} />
          </FormField>
          {kind === 'regeneration' ? (
            <FormField label="How" htmlFor="change-cycle" hint="Counted as a care cycle on each cartridge.">
              <Select
                id="change-cycle"
                value={cycleKind}
                onChange={(e) => setCycleKind(e.target.value as typeof cycleKind)}
                options={[
                  { value: 'hot-water', label: 'Hot water' },
                  { value: 'steam', label: 'Steam' },
                  { value: 'chemical', label: 'Chemical clean' },
                  { value: 'backflush', label: 'Backflush' },
                ]}
              />
            </FormField>
          ) : null}
        </div>
        <fieldset className="flex flex-col gap-2">
          <legend className="text-sm font-semibold text-ink-800">{kind === 'change' ? 'Came out' : 'Regenerated'}</legend>
          {inNow.length === 0 ? <p className="text-base text-ink-700">No cartridge is in this stage.</p> : null}
          {inNow.map((c) => (
            <label key={c.id} className="flex min-h-11 items-center gap-3 text-base text-ink-900">
              <input type="checkbox" className="size-5" checked={out.includes(c.cartridgeId)} onChange={() => setOut(toggle(out, c.cartridgeId))} />
              <span className="num">{c.serial}</span> · {c.typeName}
            </label>
          ))}
          {errors.removedCartridgeIds ? <p className="text-sm font-semibold text-stop-700">{errors.removedCartridgeIds}</p> : null}
        </fieldset>
        {kind === 'change' ? (
          <fieldset className="flex flex-col gap-2">
            <legend className="text-sm font-semibold text-ink-800">Went in (from stock)</legend>
            {stock.isPending ? <p className="text-base text-ink-700">Loading the cartridges in stock …</p> : null}
            {stock.data?.items.length === 0 ? <p className="text-base text-ink-700">No cartridge is in stock.</p> : null}
            {stock.data?.items.map((c) => (
              <label key={c.id} className="flex min-h-11 items-center gap-3 text-base text-ink-900">
                <input type="checkbox" className="size-5" checked={into.includes(c.id)} onChange={() => setInto(toggle(into, c.id))} />
                <span className="num">{c.serial}</span> · {c.typeName} · {c.lengthIn}″{c.typeId !== stage.cartridgeTypeId ? ' · not the planned type' : ''}
              </label>
            ))}
            {errors.installedCartridgeIds ? <p className="text-sm font-semibold text-stop-700">{errors.installedCartridgeIds}</p> : null}
          </fieldset>
        ) : null}
      </form>
    </Dialog>
  );
}

function StageCartridges({ stage }: { stage: RunStageDto }) {
  const units = useUnits();
  if (stage.cartridges.length === 0) return <p className="text-base text-ink-700">No cartridge was recorded in this stage (a run started before runs were bound to cartridges).</p>;
  return (
    <ul className="flex flex-col gap-1.5">
      {stage.cartridges.map((c) => {
        const out = c.removedAtVolumeL !== null;
        return (
          <li key={c.id} className="flex flex-col rounded-md border border-ink-200 px-3 py-2 sm:flex-row sm:items-center sm:justify-between">
            <span className="text-base text-ink-900">
              <span className="num font-semibold">{c.serial}</span>
              {c.batch ? <> · batch {c.batch}</> : null} · {c.typeName}
            </span>
            <span className="num text-sm text-ink-700">
              in at {units.format('volume', c.installedAtVolumeL)}
              {out ? <> · out at {units.format('volume', c.removedAtVolumeL)}</> : null}
              {c.litresCarried !== null ? <> · carried {units.format('volume', c.litresCarried)}</> : null} · {c.cyclesAtStart} cycles before
            </span>
          </li>
        );
      })}
    </ul>
  );
}

/** What was physically in each stage, the changes during the run, and the change action. */
export function RunCartridges({ run }: { run: RunDetailDto }) {
  const units = useUnits();
  const mayLog = useCan('runs:log');
  const [open, setOpen] = useState(false);
  const running = run.status === 'running';
  return (
    <Card
      title="Cartridges in the train"
      description="Recorded at start from what was installed, and at every change."
      actions={
        running && mayLog ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            <Repeat aria-hidden="true" className="size-5" /> Change cartridges
          </Button>
        ) : undefined
      }
    >
      <div className="flex flex-col gap-4">
        {run.override ? (
          <div className="rounded-md border border-watch-200 p-3" data-testid="run-override">
            <p className="text-sm font-semibold uppercase tracking-wide text-watch-700">Started despite the start checks</p>
            <p className="text-base text-ink-900">“{run.override.reason}”{run.override.byName ? ` — ${run.override.byName}` : ''}</p>
            <ul className="list-disc pl-5 text-sm text-ink-700">
              {run.override.checks.map((c) => (
                <li key={`${String(c.stageIndex)}-${c.code}`}>{c.message}</li>
              ))}
            </ul>
          </div>
        ) : null}
        {run.stages.map((s) => (
          <section key={s.index} className="flex flex-col gap-2" aria-label={`Cartridges of stage ${String(s.index + 1)}`}>
            <h3 className="text-base font-semibold text-ink-900">
              {s.index + 1}. {s.name} · {s.housingName}
            </h3>
            <StageCartridges stage={s} />
          </section>
        ))}
        {run.changes.length > 0 ? (
          <section className="flex flex-col gap-1" aria-label="Changes during the run">
            <h3 className="text-base font-semibold text-ink-900">Changes during the run</h3>
            {run.changes.map((c) => (
              <p key={c.id} className="text-sm text-ink-700">
                <span className="num">{units.format('volume', c.atVolumeL)}</span> · stage {c.stageIndex + 1} ·{' '}
                {c.kind === 'change' ? `out ${c.removedSerials.join(', ') || '—'}, in ${c.installedSerials.join(', ') || '—'}` : `regenerated ${c.removedSerials.join(', ')}`}
                {c.byName ? ` · ${c.byName}` : ''}
              </p>
            ))}
          </section>
        ) : null}
      </div>
      {open ? <ChangeDialog run={run} onClose={() => setOpen(false)} /> : null}
    </Card>
  );
}
