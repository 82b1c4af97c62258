// Times the run page's pure work (no database) at 5,000 readings vs 100.
import { effectiveReadings } from '../../server/modules/runs/runs.presenter';
import { stageFigures } from '../../server/modules/runs/runs.service';
import { chartPointsPerStage, thinSeries } from '../../shared/chart/thin';
function rows(n: number) {
  return Array.from({ length: n }, (_x, i) => ({
    id: `r${String(i)}`, wineryId: 'w', runId: 'x', clientKey: `k${String(i)}`, stageIndex: i % 2, volumeL: 60 * (i + 1),
    upstreamBar: 1.4 + i * 0.0002, downstreamBar: 0.1, flowLh: null, tempC: null, at: new Date(1e12 + i), createdBy: null, createdAt: new Date(), byName: null,
  })) as never[];
}
for (const n of [100, 5000, 100, 5000]) {
  const raw = rows(n);
  const t = { eff: 0, fig: 0, thin: 0 };
  for (let k = 0; k < 20; k++) {
    let a = performance.now();
    const eff = effectiveReadings(raw, []);
    t.eff += performance.now() - a;
    for (const s of [0, 1]) {
      const own = eff.filter((r) => r.stageIndex === s);
      a = performance.now();
      stageFigures({ readings: own, terminalDpBar: 2, lineFlowLh: 3000, currentVolumeL: 60 * n, volumeToBottleL: 1000, restartsAtL: [], resolutionBar: 0.02 });
      t.fig += performance.now() - a;
      a = performance.now();
      thinSeries(own, { max: chartPointsPerStage(2), y: (r) => r.upstreamBar - r.downstreamBar, keep: (r) => r.corrections.length > 0 });
      t.thin += performance.now() - a;
    }
  }
  console.log(n, Object.fromEntries(Object.entries(t).map(([k, v]) => [k, (v / 20).toFixed(2)])));
}
