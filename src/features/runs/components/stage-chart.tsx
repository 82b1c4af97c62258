import { CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import type { RunStageDto } from '@shared/types/runs';
import { useUnits } from '@/lib/units';
import { cn } from '@/utils/cn';

const READINGS = '#1f6f78';
const WAITING = '#ae7b12';
const FIT = '#8a3b4a';

/** A reading kept on the device, not yet stored (drawn with its own marker). */
export type WaitingPoint = { volumeL: number; dpBar: number };

/** ΔP against litres for one stage: the readings, those waiting to send, the fitted curve and the terminal ΔP line. */
export function StageChart({ stage, waiting = [], compact = false }: { stage: RunStageDto; waiting?: WaitingPoint[]; compact?: boolean }) {
  const units = useUnits();
  const v = (l: number) => units.toInput('volume', l, 6);
  const dp = (b: number) => units.toInput('dp', b, 6);
  const num = (s: string) => Number(s);
  // a voided reading stays in the record but not on the chart or in the fit
  const readings = stage.readings.filter((r) => !r.voided).map((r) => ({ x: num(v(r.volumeL)), reading: num(dp(r.dpBar)) }));
  const kept = waiting.map((r) => ({ x: num(v(r.volumeL)), waiting: num(dp(r.dpBar)) }));
  const curve = stage.curve.map((c) => ({ x: num(v(c.volumeL)), fit: num(dp(c.dpBar)) }));
  const data = [...readings, ...kept, ...curve].sort((a, b) => a.x - b.x);
  const terminal = num(dp(stage.terminalDpBar));
  return (
    <figure className="flex flex-col gap-1">
      <div className={cn('w-full', compact ? 'h-36' : 'h-56')} role="img" aria-label={`ΔP against litres for ${stage.name}, with the terminal ΔP`}>
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: -8 }}>
            <CartesianGrid stroke="#e2e8f0" strokeDasharray="3 3" />
            <XAxis dataKey="x" type="number" domain={[0, 'dataMax']} tick={{ fontSize: 12 }} tickFormatter={(t: number) => Math.round(t).toLocaleString('en')} />
            <YAxis type="number" domain={[0, (max: number) => Math.max(max, terminal) * 1.1]} tick={{ fontSize: 12 }} width={52} tickFormatter={(t: number) => t.toFixed(2)} />
            <Tooltip formatter={(value) => [`${Number(value).toFixed(3)} ${units.symbol('dp')}`]} labelFormatter={(x) => `${Math.round(Number(x)).toLocaleString('en')} ${units.symbol('volume')}`} />
            <ReferenceLine y={terminal} stroke="#b42318" strokeDasharray="6 4" label={{ value: 'terminal ΔP', position: 'insideTopLeft', fontSize: 12 }} />
            <Line dataKey="fit" name="Fitted" stroke={FIT} dot={false} connectNulls isAnimationActive={false} />
            <Scatter dataKey="reading" name="Readings" fill={READINGS} isAnimationActive={false} />
            {kept.length > 0 ? <Scatter dataKey="waiting" name="Waiting to send" fill="#fff" stroke={WAITING} strokeWidth={2} shape="diamond" isAnimationActive={false} /> : null}
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {compact ? null : (
        <figcaption className="text-sm text-ink-600">
          Litres ({units.symbol('volume')}) across, ΔP ({units.symbol('dp')}) up. Dots: readings{kept.length > 0 ? ' · hollow diamonds: waiting to send' : ''} · line: fitted curve · dashed: terminal ΔP{' '}
          {units.format('dp', stage.terminalDpBar)}
        </figcaption>
      )}
    </figure>
  );
}
