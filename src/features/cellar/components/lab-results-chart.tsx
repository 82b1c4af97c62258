import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { LabResultDto, ReadinessThresholdsUsedDto } from '@shared/types/cellar';
import { formatDateTime, formatDayMonth } from '@/lib/dates';

const TURBIDITY = '#1f6f78';
const CLOGGING = '#8a3b4a';

/**
 * Turbidity (NTU, left axis) and clogging index (s, right axis) over time, with the lot's
 * turbidity limit and the ready limit of the clogging index drawn as dashed lines.
 */
export function LabResultsChart({ results, thresholds }: { results: LabResultDto[]; thresholds: ReadinessThresholdsUsedDto }) {
  const data = [...results]
    .sort((a, b) => a.sampledAt.localeCompare(b.sampledAt))
    .map((r) => ({ t: new Date(r.sampledAt).getTime(), turbidity: r.turbidityNtu, ci: r.cloggingIndex }));
  const hasCi = data.some((d) => d.ci !== null);
  const hasNtu = data.some((d) => d.turbidity !== null);

  return (
    <figure className="flex flex-col gap-2">
      <div className="h-64 w-full" role="img" aria-label="Chart of turbidity and clogging index over time">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 4, bottom: 0, left: -8 }}>
            <CartesianGrid stroke="#e2e8f0" strokeDasharray="3 3" />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={['dataMin', 'dataMax']}
              tickFormatter={(t: number) => formatDayMonth(t)}
              tick={{ fontSize: 12 }}
              padding={{ left: 16, right: 16 }}
            />
            <YAxis yAxisId="ntu" tick={{ fontSize: 12 }} width={48} label={{ value: 'NTU', angle: -90, position: 'insideLeft', offset: 16, fontSize: 12 }} />
            <YAxis yAxisId="s" orientation="right" tick={{ fontSize: 12 }} width={44} label={{ value: 's', angle: 0, position: 'insideTopRight', fontSize: 12 }} />
            <Tooltip
              labelFormatter={(t) => formatDateTime(Number(t))}
              formatter={(value, name) => [name === 'Turbidity' ? `${String(value)} NTU` : `${String(value)} s`, name]}
            />
            <Legend wrapperStyle={{ fontSize: 13 }} />
            {hasNtu ? (
              <ReferenceLine yAxisId="ntu" y={thresholds.turbidity.limitNtu} stroke={TURBIDITY} strokeDasharray="6 4" ifOverflow="extendDomain" />
            ) : null}
            {hasCi ? <ReferenceLine yAxisId="s" y={thresholds.cloggingIndex.readyMaxS} stroke={CLOGGING} strokeDasharray="2 4" ifOverflow="extendDomain" /> : null}
            <Line yAxisId="ntu" name="Turbidity" dataKey="turbidity" stroke={TURBIDITY} strokeWidth={2} dot={{ r: 4 }} connectNulls isAnimationActive={false} />
            <Line
              yAxisId="s"
              name="Clogging index"
              dataKey="ci"
              stroke={CLOGGING}
              strokeWidth={2}
              strokeDasharray="5 3"
              dot={{ r: 4, strokeDasharray: '' }}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-sm text-ink-600">
        Dashed lines: the turbidity limit for this style ({thresholds.turbidity.limitNtu} NTU, left axis) and the ready limit of the clogging index (
        {thresholds.cloggingIndex.readyMaxS} s, right axis).
      </figcaption>
    </figure>
  );
}
