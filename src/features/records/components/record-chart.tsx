import type { RecordStageDto } from '@shared/types/records';
import { useUnits } from '@/lib/units';

const W = 480;
const H = 210;
const PAD = { left: 60, right: 16, top: 12, bottom: 36 };

/** Effective points of a stage's readings (the latest correction wins; voided ones left out). */
export function effectivePoints(stage: RecordStageDto) {
  return stage.readings
    .filter((r) => !r.voided)
    .map((r) => {
      const c = r.corrections.at(-1);
      const pick = (v: number | null | undefined, orig: number) => (c?.kind === 'correct' && v !== null && v !== undefined ? v : orig);
      return { volumeL: pick(c?.volumeL, r.volumeL), dpBar: pick(c?.upstreamBar, r.upstreamBar) - pick(c?.downstreamBar, r.downstreamBar) };
    });
}

/** ΔP against litres as a plain SVG (it prints as vectors): readings, fitted law, terminal ΔP. */
export function RecordChart({ stage }: { stage: RecordStageDto }) {
  const units = useUnits();
  const points = effectivePoints(stage);
  if (points.length === 0) return null;
  const maxPointV = Math.max(...points.map((p) => p.volumeL), 1);
  const curve = stage.curve.filter((p) => p.volumeL <= maxPointV * 1.6);
  const maxV = Math.max(maxPointV, ...curve.map((p) => p.volumeL)) * 1.05;
  const maxDp = Math.max(stage.terminalDpBar, ...points.map((p) => p.dpBar), 0.1) * 1.15;
  const x = (v: number) => PAD.left + (v / maxV) * (W - PAD.left - PAD.right);
  const y = (dp: number) => PAD.top + (1 - Math.max(0, Math.min(dp, maxDp)) / maxDp) * (H - PAD.top - PAD.bottom);
  const ticks = [0, 1, 2, 3, 4];
  const vLabel = (v: number) => Number(units.toInput('volume', v, 0)).toLocaleString('en');
  const dpLabel = (b: number) => Number(units.toInput('dp', b, 2)).toFixed(2);
  return (
    <figure className="record-keep flex flex-col gap-1">
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-xl" role="img" aria-label={`ΔP against litres for stage ${stage.index + 1}, ${stage.name}, with the fitted law and the terminal ΔP`}>
        <rect x={PAD.left} y={PAD.top} width={W - PAD.left - PAD.right} height={H - PAD.top - PAD.bottom} fill="none" stroke="#c9d1cc" />
        {ticks.map((i) => (
          <g key={i}>
            <line x1={PAD.left} x2={W - PAD.right} y1={y((maxDp * i) / 4)} y2={y((maxDp * i) / 4)} stroke="#e3e8e5" />
            <text x={PAD.left - 6} y={y((maxDp * i) / 4) + 5} fontSize="14" textAnchor="end" fill="#5b6760">
              {dpLabel((maxDp * i) / 4)}
            </text>
            <text x={x((maxV * i) / 4)} y={H - PAD.bottom + 22} fontSize="14" textAnchor="middle" fill="#5b6760">
              {vLabel((maxV * i) / 4)}
            </text>
          </g>
        ))}
        {stage.terminalDpBar > 0 ? <line x1={PAD.left} x2={W - PAD.right} y1={y(stage.terminalDpBar)} y2={y(stage.terminalDpBar)} stroke="#b42318" strokeDasharray="6 4" strokeWidth="1.5" /> : null}
        {curve.length > 1 ? <polyline points={curve.map((p) => `${x(p.volumeL).toFixed(1)},${y(p.dpBar).toFixed(1)}`).join(' ')} fill="none" stroke="#2f6f5e" strokeWidth="2" /> : null}
        {points.map((p, i) => (
          <circle key={i} cx={x(p.volumeL)} cy={y(p.dpBar)} r="4.5" fill="#1f2a24" />
        ))}
      </svg>
      <figcaption className="text-sm text-ink-600">
        Litres ({units.symbol('volume')}) across, ΔP ({units.symbol('dp')}) up. Dots: readings{curve.length > 1 ? ' · line: fitted law' : ''} · dashed: terminal ΔP {units.format('dp', stage.terminalDpBar)}
      </figcaption>
    </figure>
  );
}
