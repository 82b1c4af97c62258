import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { useUnits } from '@/lib/units';

/** ΔP against litres of a logger file, as read (thinned to a few hundred points by the server). */
export function LoggerChart({ points }: { points: { volumeL: number; dpBar: number }[] }) {
  const units = useUnits();
  const data = points.map((p) => ({ x: Number(units.toInput('volume', p.volumeL, 6)), y: Number(units.toInput('dp', p.dpBar, 6)) }));
  return (
    <figure className="flex flex-col gap-1">
      <div className="h-56 w-full" role="img" aria-label={`ΔP against litres for the ${String(points.length)} points of the file`}>
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 8, right: 8, bottom: 0, left: -8 }}>
            <CartesianGrid stroke="#e2e8f0" strokeDasharray="3 3" />
            <XAxis dataKey="x" type="number" domain={[0, 'dataMax']} tick={{ fontSize: 12 }} tickFormatter={(t: number) => Math.round(t).toLocaleString('en')} name="Litres" />
            <YAxis dataKey="y" type="number" domain={[0, 'auto']} tick={{ fontSize: 12 }} width={52} tickFormatter={(t: number) => t.toFixed(2)} name="ΔP" />
            <Tooltip formatter={(value, name) => [name === 'ΔP' ? `${Number(value).toFixed(3)} ${units.symbol('dp')}` : `${Math.round(Number(value)).toLocaleString('en')} ${units.symbol('volume')}`, name]} />
            <Scatter data={data} fill="#1f6f78" isAnimationActive={false} />
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-sm text-ink-600">
        Litres ({units.symbol('volume')}) across, ΔP ({units.symbol('dp')}) up, as read from the file.
      </figcaption>
    </figure>
  );
}
