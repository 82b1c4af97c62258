import { CloudOff, OctagonX, Trash2 } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { FormField } from '@/components/ui/form-field';
import { NumberInput } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Select } from '@/components/ui/select';
import { discard, flushOutbox, resend, useOutbox, type OutboxEntry } from '@/lib/offline/outbox-runtime';
import { useOnline } from '@/lib/offline/use-online';
import { useOpenRuns } from '../api/get-open-runs';
import { formatDayMonthTime } from '@/lib/dates';

/** Plain names for the figures an entry may carry (as stored: metric). */
const FIELD_LABELS: Record<string, string> = {
  volumeL: 'Litres through the train (L)',
  upstreamBar: 'Upstream pressure (bar)',
  downstreamBar: 'Downstream pressure (bar)',
  flowLh: 'Flow (L/h)',
  tempC: 'Temperature (°C)',
  stageIndex: 'Stage number (first is 0)',
};

function FixDialog({ entry, onClose }: { entry: OutboxEntry; onClose: () => void }) {
  const numeric = Object.entries(entry.body).filter(([k, v]) => typeof v === 'number' && k !== 'stageIndex');
  const [values, setValues] = useState<Record<string, string>>(Object.fromEntries(numeric.map(([k, v]) => [k, String(v)])));
  const [error, setError] = useState<string | null>(null);
  const save = () => {
    const body: Record<string, unknown> = { ...entry.body };
    for (const [k, v] of Object.entries(values)) {
      const n = Number(v.trim().replace(',', '.'));
      if (v.trim() === '' || !Number.isFinite(n)) {
        setError(`Enter ${FIELD_LABELS[k] ?? k} as a number.`);
        return;
      }
      body[k] = n;
    }
    void resend(entry.id, { body });
    onClose();
  };
  return (
    <Dialog
      open
      onClose={onClose}
      title="Fix and send again"
      description={entry.label}
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Cancel
          </Button>
          <Button onClick={save}>Send again</Button>
        </>
      }
    >
      <div className="flex flex-col gap-3">
        {numeric.map(([k]) => (
          <FormField key={k} label={FIELD_LABELS[k] ?? k} htmlFor={`fix-${k}`} error={entry.refusal?.fields[k]}>
            <NumberInput id={`fix-${k}`} value={values[k]} onChange={(e) => setValues({ ...values, [k]: e.target.value })} />
          </FormField>
        ))}
        {error ? (
          <p role="alert" className="font-semibold text-stop-700">
            {error}
          </p>
        ) : null}
      </div>
    </Dialog>
  );
}

function MoveDialog({ entry, onClose }: { entry: OutboxEntry; onClose: () => void }) {
  const runs = useOpenRuns(true);
  const [runId, setRunId] = useState('');
  const [stage, setStage] = useState(String((entry.body.stageIndex as number | undefined) ?? 0));
  const options = (runs.data ?? []).filter((r) => r.id !== entry.runId);
  return (
    <Dialog
      open
      onClose={onClose}
      title="Move this reading to another run"
      description={entry.label}
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Cancel
          </Button>
          <Button
            disabled={!runId}
            onClick={() => {
              void resend(entry.id, { runId, path: `/runs/${encodeURIComponent(runId)}/readings`, body: { ...entry.body, stageIndex: Number(stage) } });
              onClose();
            }}
          >
            Move and send
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-3">
        {runs.isPending ? <p>Loading the runs in progress …</p> : null}
        {runs.data && options.length === 0 ? <p>No other run is in progress.</p> : null}
        <FormField label="Run in progress" htmlFor="move-run">
          <Select
            id="move-run"
            value={runId}
            onChange={(e) => setRunId(e.target.value)}
            options={[{ value: '', label: 'Choose a run' }, ...options.map((r) => ({ value: r.id, label: `${r.lotCode} · ${r.lotName} · ${r.planName}` }))]}
          />
        </FormField>
        <FormField label="Stage number (the first stage is 1)" htmlFor="move-stage">
          <NumberInput id="move-stage" value={String(Number(stage) + 1)} onChange={(e) => setStage(String(Math.max(0, Number(e.target.value) - 1) || 0))} />
        </FormField>
      </div>
    </Dialog>
  );
}

function EntryCard({ entry }: { entry: OutboxEntry }) {
  const [open, setOpen] = useState<'fix' | 'move' | 'discard' | null>(null);
  const refused = entry.status === 'refused';
  return (
    <li className={refused ? 'rounded-lg border-2 border-stop-200 bg-stop-50 p-4' : 'rounded-lg border border-watch-200 bg-watch-50 p-4'}>
      <div className="flex items-start gap-3">
        {refused ? <OctagonX aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-stop-700" /> : <CloudOff aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-watch-700" />}
        <div className="min-w-0 flex-1">
          <p className="num font-semibold text-ink-900">{entry.label}</p>
          <p className="text-sm text-ink-700">
            Made {formatDayMonthTime(entry.createdAt)} · {refused ? 'refused by the server' : 'waiting to send'}
          </p>
          {refused && entry.refusal ? (
            <div className="mt-1 text-base text-stop-800">
              <p className="font-semibold">{entry.refusal.message}</p>
              {Object.values(entry.refusal.fields).map((m) => (
                <p key={m}>{m}</p>
              ))}
            </div>
          ) : null}
        </div>
      </div>
      {refused ? (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => setOpen('fix')}>
            Fix
          </Button>
          {entry.kind === 'reading' ? (
            <Button variant="secondary" onClick={() => setOpen('move')}>
              Move
            </Button>
          ) : null}
          <Button variant="danger" icon={<Trash2 aria-hidden="true" />} onClick={() => setOpen('discard')}>
            Discard
          </Button>
        </div>
      ) : null}
      {open === 'fix' ? <FixDialog entry={entry} onClose={() => setOpen(null)} /> : null}
      {open === 'move' ? <MoveDialog entry={entry} onClose={() => setOpen(null)} /> : null}
      <Dialog
        open={open === 'discard'}
        onClose={() => setOpen(null)}
        title="Discard this entry?"
        description={`${entry.label} — it was never stored, and discarding it removes it from this device for good.`}
        footer={
          <>
            <Button variant="ghost" onClick={() => setOpen(null)}>
              Keep it
            </Button>
            <Button
              variant="danger"
              onClick={() => {
                void discard(entry.id);
                setOpen(null);
              }}
            >
              Discard
            </Button>
          </>
        }
      />
    </li>
  );
}

/** Entries kept on this device: those waiting to send, and those the server refused. */
export function WaitingPage() {
  const entries = useOutbox();
  const online = useOnline();
  const refused = entries.filter((e) => e.status === 'refused');
  const waiting = entries.filter((e) => e.status === 'waiting');
  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-6">
      <PageHeader
        title="Waiting to send"
        description="Readings, care cycles and integrity tests saved on this device and not yet stored. They are sent in order when there is a connection."
        actions={
          online && waiting.length > 0 ? (
            <Button variant="secondary" onClick={() => void flushOutbox()}>
              Send now
            </Button>
          ) : null
        }
      />
      {entries.length === 0 ? <EmptyState title="Nothing is waiting">Everything saved on this device has been stored.</EmptyState> : null}
      {refused.length > 0 ? (
        <Card title="Refused" description="The server did not store these. Fix, move or discard each one; nothing is dropped without you.">
          <ul className="flex flex-col gap-3">
            {refused.map((e) => (
              <EntryCard key={e.id} entry={e} />
            ))}
          </ul>
        </Card>
      ) : null}
      {waiting.length > 0 ? (
        <Card title="Waiting" description={online ? 'Sending …' : 'Offline: these are sent when the connection is back.'}>
          <ul className="flex flex-col gap-3">
            {waiting.map((e) => (
              <EntryCard key={e.id} entry={e} />
            ))}
          </ul>
        </Card>
      ) : null}
    </div>
  );
}
