import { useState, type FormEvent } from 'react';
import { CORRECTION_REASON_MAX } from '@shared/schemas/runs';
import type { RunDetailDto, RunReadingDto } from '@shared/types/runs';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { FormMessage } from '@/components/ui/form-message';
import { NumberInput, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useRunReadingPages } from '../api/get-run-readings';
import { useCorrectReading, useVoidReading } from '../api/run-changes';
import { formatDateTime } from '@/lib/dates';
import { ReadingsPager } from './readings-pager';

const parse = (s: string): number | null => {
  const t = s.trim().replace(',', '.');
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
};

const when = (iso: string) => formatDateTime(iso);

/** Correct a reading's values or void it, always with a reason; the original is kept. */
function CorrectDialog({ runId, reading, mode, onClose }: { runId: string; reading: RunReadingDto; mode: 'correct' | 'void'; onClose: () => void }) {
  const units = useUnits();
  const toast = useToast();
  const correct = useCorrectReading();
  const voidIt = useVoidReading();
  const [volume, setVolume] = useState(units.toInput('volume', reading.volumeL));
  const [up, setUp] = useState(units.toInput('pressure', reading.upstreamBar));
  const [down, setDown] = useState(units.toInput('pressure', reading.downstreamBar));
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const pending = correct.isPending || voidIt.isPending;

  function submit(e: FormEvent) {
    e.preventDefault();
    setFormError(null);
    const onError = (err: Error) => {
      if (err instanceof ApiError && Object.keys(err.fields).length) setErrors(err.fields);
      setFormError(errorMessage(err));
    };
    const onSuccess = () => {
      toast.success(mode === 'correct' ? 'Reading corrected' : 'Reading voided');
      onClose();
    };
    if (mode === 'void') {
      voidIt.mutate({ runId, readingId: reading.id, input: { reason } }, { onSuccess, onError });
      return;
    }
    const v = parse(volume);
    const u = parse(up);
    const d = parse(down);
    const next: Record<string, string> = {};
    if (v === null) next.volumeL = 'Enter the litres through the train.';
    if (u === null) next.upstreamBar = 'Enter the upstream pressure.';
    if (d === null) next.downstreamBar = 'Enter the downstream pressure.';
    setErrors(next);
    if (v === null || u === null || d === null) return;
    correct.mutate(
      {
        runId,
        readingId: reading.id,
        input: {
          volumeL: units.fromInput('volume', v),
          upstreamBar: units.fromInput('pressure', u),
          downstreamBar: units.fromInput('pressure', d),
          flowLh: reading.flowLh,
          tempC: reading.tempC,
          reason,
        },
      },
      { onSuccess, onError },
    );
  }

  return (
    <Dialog
      open
      onClose={onClose}
      title={mode === 'correct' ? 'Correct this reading' : 'Void this reading'}
      description={
        mode === 'correct'
          ? 'The reading as logged is kept, struck through, beside the corrected values; fits and forecasts use the corrected ones.'
          : 'The reading stays in the record, struck through, and leaves the fits and forecasts.'
      }
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form="reading-correction-form" variant={mode === 'void' ? 'danger' : 'primary'} disabled={pending}>
            {mode === 'correct' ? 'Save correction' : 'Void reading'}
          </Button>
        </>
      }
    >
      <form id="reading-correction-form" className="flex flex-col gap-3" onSubmit={submit} noValidate>
        <FormMessage message={formError} />
        {mode === 'correct' ? (
          <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
            <FormField label="Litres so far" htmlFor="corr-volume" error={errors.volumeL}>
              <NumberInput id="corr-volume" unit={units.symbol('volume')} value={volume} onChange={(e) => setVolume(e.target.value)} />
            </FormField>
            <FormField label="Upstream" htmlFor="corr-up" error={errors.upstreamBar}>
              <NumberInput id="corr-up" unit={units.symbol('pressure')} value={up} onChange={(e) => setUp(e.target.value)} />
            </FormField>
            <FormField label="Downstream" htmlFor="corr-down" error={errors.downstreamBar}>
              <NumberInput id="corr-down" unit={units.symbol('pressure')} value={down} onChange={(e) => setDown(e.target.value)} />
            </FormField>
          </div>
        ) : null}
        <FormField label="Why" htmlFor="corr-reason" error={errors.reason} required hint="Kept in the record with your name and the time.">
          <Textarea id="corr-reason" rows={2} maxLength={CORRECTION_REASON_MAX} value={reason} onChange={(e) => setReason(e.target.value)} />
        </FormField>
      </form>
    </Dialog>
  );
}

function ReadingLine({ reading, stageName, onAct, mayLog }: { reading: RunReadingDto; stageName: string; onAct: (mode: 'correct' | 'void') => void; mayLog: boolean }) {
  const units = useUnits();
  const last = reading.corrections[reading.corrections.length - 1];
  const values = (r: { volumeL: number; upstreamBar: number; downstreamBar: number }) =>
    `${units.format('volume', r.volumeL)} · ΔP ${units.format('dp', r.upstreamBar - r.downstreamBar)}`;
  return (
    <li className="flex flex-col gap-1 rounded-md border border-ink-200 px-3 py-2" data-testid={`reading-${reading.id}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="num text-base text-ink-900">
          <span className="text-ink-600">{stageName} · </span>
          {reading.voided ? <s aria-label={`Voided: ${values(reading)}`}>{values(reading)}</s> : values(reading)}
          {reading.original ? (
            <>
              {' '}
              <s className="text-ink-500" aria-label={`As logged: ${values(reading.original)}`}>
                {values(reading.original)}
              </s>
            </>
          ) : null}
        </p>
        {mayLog ? (
          <span className="flex gap-2">
            <Button size="sm" variant="ghost" onClick={() => onAct('correct')}>
              Correct
            </Button>
            {!reading.voided ? (
              <Button size="sm" variant="ghost" onClick={() => onAct('void')}>
                Void
              </Button>
            ) : null}
          </span>
        ) : null}
      </div>
      {last ? (
        <p className="text-sm text-ink-700">
          {last.kind === 'void' ? 'Voided' : 'Corrected'}
          {last.byName ? ` by ${last.byName}` : ''} · {when(last.at)} · “{last.reason}”
        </p>
      ) : null}
    </li>
  );
}

const PAGE = 20;

/** The run's readings, newest first and a page at a time, with corrections shown and the correct / void actions. */
export function ReadingCorrections({ run }: { run: RunDetailDto }) {
  const mayLog = useCan('runs:log');
  const [acting, setActing] = useState<{ reading: RunReadingDto; mode: 'correct' | 'void' } | null>(null);
  const { stored, page: pageNo, setPage: setPageNo, pages } = useRunReadingPages(run.id, 'all', PAGE);
  const nameOf = new Map(run.stages.map((s) => [s.index, s.name]));
  const all = (stored.data?.items ?? []).map((r) => ({ r, stageName: nameOf.get(r.stageIndex) ?? `Stage ${String(r.stageIndex + 1)}` }));
  if (all.length === 0 && pageNo === 1) return null;
  return (
    <Card title="Readings and corrections" description="A reading typed wrong is corrected or voided with a reason; the original stays, struck through.">
      <ul className="flex flex-col gap-2">
        {all.map(({ r, stageName }) => (
          <ReadingLine key={r.id} reading={r} stageName={stageName} mayLog={mayLog} onAct={(mode) => setActing({ reading: r, mode })} />
        ))}
      </ul>
      <ReadingsPager label="Pages of the readings and corrections" className="mt-2" page={pageNo} pages={pages} onPageChange={setPageNo} />
      {acting ? <CorrectDialog runId={run.id} reading={acting.reading} mode={acting.mode} onClose={() => setActing(null)} /> : null}
    </Card>
  );
}
