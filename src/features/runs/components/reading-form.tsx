import { CircleCheck, CloudOff } from 'lucide-react';
import { useRef, useState, type FormEvent } from 'react';
import type { RunDetailDto } from '@shared/types/runs';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { NumberInput } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { newKey } from '@/lib/offline/outbox-runtime';
import { useUnits } from '@/lib/units';
import { keepAndSendReading } from '../api/log-reading';
import { SavedReading } from './saved-reading';
import { parseNumberText } from '@/lib/number-input';

const parse = (s: string): number | null => {
  const n = parseNumberText(s);
  return n !== null && Number.isFinite(n) ? n : null;
};

type Fields = { volumeL?: string; upstreamBar?: string; downstreamBar?: string; stageIndex?: string; flowLh?: string; tempC?: string };

/** Log one reading: stage, litres so far and both gauges, in the person's units. */
export function ReadingForm({ run }: { run: RunDetailDto }) {
  const units = useUnits();
  const [pending, setPending] = useState(false);
  const [stage, setStage] = useState('0');
  const [volume, setVolume] = useState('');
  const [up, setUp] = useState('');
  const [down, setDown] = useState('');
  // Flow and temperature change slowly: they stay filled in from one reading to the next.
  // A page opened afresh starts from the run's latest flow and temperature.
  const latest = (pick: (r: RunDetailDto['stages'][number]['readings'][number]) => number | null) =>
    run.stages
      .flatMap((st) => st.readings)
      .filter((r) => pick(r) !== null)
      .sort((a, b) => b.at.localeCompare(a.at))[0];
  const [flow, setFlow] = useState(() => units.toInput('flow', latest((r) => r.flowLh)?.flowLh ?? null));
  const [temp, setTemp] = useState(() => units.toInput('temperature', latest((r) => r.tempC)?.tempC ?? null, 1));
  const [errors, setErrors] = useState<Fields>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<{ stageIndex: number; text: string; waiting: boolean } | null>(null);
  // The key of the reading being sent; kept until it is stored so a retry reuses it.
  const pendingKey = useRef<string | null>(null);
  const sent = useRef<string>('');

  function submit(e: FormEvent) {
    e.preventDefault();
    const v = parse(volume);
    const u = parse(up);
    const d = parse(down);
    const f = flow.trim() ? parse(flow) : undefined;
    const t = temp.trim() ? parse(temp) : undefined;
    const next: Fields = {};
    if (f === null) next.flowLh = 'Enter the flow as a number, or leave it empty.';
    if (t === null) next.tempC = 'Enter the temperature as a number, or leave it empty.';
    if (v === null) next.volumeL = 'Enter the litres through the train so far.';
    if (u === null) next.upstreamBar = 'Enter the upstream pressure.';
    if (d === null) next.downstreamBar = 'Enter the downstream pressure.';
    setErrors(next);
    setFormError(null);
    if (v === null || u === null || d === null || f === null || t === null) return;
    const signature = [stage, volume, up, down, flow, temp].join('|');
    if (!pendingKey.current || sent.current !== signature) pendingKey.current = newKey();
    sent.current = signature;
    const input = {
      clientKey: pendingKey.current,
      stageIndex: Number(stage),
      volumeL: units.fromInput('volume', v),
      upstreamBar: units.fromInput('pressure', u),
      downstreamBar: units.fromInput('pressure', d),
      ...(f !== undefined ? { flowLh: units.fromInput('flow', f) } : {}),
      ...(t !== undefined ? { tempC: units.fromInput('temperature', t) } : {}),
    };
    const stageIndex = Number(stage);
    const text = `${run.stages[stageIndex]?.name ?? 'Stage'} · ${units.format('volume', input.volumeL)} · ΔP ${units.format('dp', input.upstreamBar - input.downstreamBar)}`;
    setPending(true);
    // Kept on the device first: a dropped connection or a closed tab loses nothing.
    void keepAndSendReading(run, input, text)
      .then((outcome) => {
        if (outcome.result === 'refused') {
          const fields = outcome.refusal.fields as Fields;
          if (Object.keys(fields).length > 0) setErrors(fields);
          setFormError(outcome.refusal.message);
          return;
        }
        pendingKey.current = null;
        setSaved({ stageIndex, text, waiting: outcome.result === 'waiting' });
        setUp('');
        setDown('');
      })
      .catch(() => setFormError('The reading could not be kept on this device. Try again.'))
      .finally(() => setPending(false));
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-labelledby="log-reading-title">
      <h2 id="log-reading-title" className="text-xl font-semibold text-ink-900">
        Log reading
      </h2>
      <FormField label="Stage" htmlFor="reading-stage" error={errors.stageIndex}>
        <Select id="reading-stage" value={stage} onChange={(e) => setStage(e.target.value)} options={run.stages.map((s) => ({ value: String(s.index), label: `${String(s.index + 1)}. ${s.name}` }))} />
      </FormField>
      <FormField label="Litres through the train so far" htmlFor="reading-volume" error={errors.volumeL}>
        <NumberInput id="reading-volume" unit={units.symbol('volume')} value={volume} onChange={(e) => setVolume(e.target.value)} invalid={!!errors.volumeL} className="text-xl" />
      </FormField>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <FormField label="Upstream pressure" htmlFor="reading-up" error={errors.upstreamBar}>
          <NumberInput id="reading-up" unit={units.symbol('pressure')} value={up} onChange={(e) => setUp(e.target.value)} invalid={!!errors.upstreamBar} className="text-xl" />
        </FormField>
        <FormField label="Downstream pressure" htmlFor="reading-down" error={errors.downstreamBar}>
          <NumberInput id="reading-down" unit={units.symbol('pressure')} value={down} onChange={(e) => setDown(e.target.value)} invalid={!!errors.downstreamBar} className="text-xl" />
        </FormField>
      </div>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <FormField label="Flow (optional)" htmlFor="reading-flow" hint="Used for the time left; otherwise the line's flow." error={errors.flowLh}>
          <NumberInput id="reading-flow" unit={units.symbol('flow')} value={flow} onChange={(e) => setFlow(e.target.value)} invalid={!!errors.flowLh} />
        </FormField>
        <FormField label="Wine temperature (optional)" htmlFor="reading-temp" error={errors.tempC}>
          <NumberInput id="reading-temp" unit={units.symbol('temperature')} value={temp} onChange={(e) => setTemp(e.target.value)} invalid={!!errors.tempC} />
        </FormField>
      </div>
      {formError ? (
        <p role="alert" className="text-base font-semibold text-stop-700">
          {formError}
        </p>
      ) : null}
      <Button type="submit" size="lg" disabled={pending}>
        {pending ? 'Saving …' : 'Save reading'}
      </Button>
      {/* Right under Save: what was kept, and the stage's ΔP, forecast and a small chart. */}
      {saved ? (
        saved.waiting ? (
          <div role="status" className="flex items-center gap-3 rounded-lg border-2 border-watch-600 bg-watch-50 p-4">
            <CloudOff aria-hidden="true" className="size-10 shrink-0 text-watch-700" />
            <div>
              <p className="text-xl font-semibold text-watch-800">Kept — waiting to send</p>
              <p className="num text-base text-ink-800">{saved.text}</p>
              <p className="text-sm text-ink-700">It is kept on this device and sent by itself when the connection is back.</p>
            </div>
          </div>
        ) : (
          <div role="status" className="flex flex-col gap-3 rounded-lg border-2 border-ok-600 bg-ok-50 p-4">
            <div className="flex items-center gap-3">
              <CircleCheck aria-hidden="true" className="size-10 shrink-0 text-ok-700" />
              <div>
                <p className="text-2xl font-semibold text-ok-800">Saved</p>
                <p className="num text-base text-ink-800">{saved.text}</p>
              </div>
            </div>
            {run.stages[saved.stageIndex] ? <SavedReading stage={run.stages[saved.stageIndex]} /> : null}
          </div>
        )
      ) : null}
    </form>
  );
}
