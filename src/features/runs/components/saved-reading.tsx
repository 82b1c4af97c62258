import type { RunStageDto } from '@shared/types/runs';
import { useUnits } from '@/lib/units';
import { formatDuration } from '@/utils/duration';
import { StageChart } from './stage-chart-lazy';

/** Under the Save button after a reading: its stage's ΔP, what is left, and a small chart. */
export function SavedReading({ stage }: { stage: RunStageDto }) {
  const units = useUnits();
  const last = stage.readings[stage.readings.length - 1];
  const f = stage.forecast;
  return (
    <div className="flex flex-col gap-2" data-testid="saved-reading">
      <p className="num text-base text-ink-800">
        {stage.name}: ΔP now {units.format('dp', last?.dpBar)} of {units.format('dp', stage.terminalDpBar)} terminal
      </p>
      {f ? (
        <p className="num text-lg font-semibold text-ink-900">
          About {units.format('volume', f.volumeLeftL)} / {formatDuration(f.timeLeft)} left
        </p>
      ) : (
        <p className="text-base text-ink-700">{stage.note ?? 'No forecast yet.'}</p>
      )}
      {stage.readings.length > 0 ? <StageChart stage={stage} compact /> : null}
    </div>
  );
}
