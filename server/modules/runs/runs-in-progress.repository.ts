import { sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import type { PlanTrainStage } from '../../db/schema';

/** Most runs in progress shown at once (a winery runs a few lines at a time). */
export const IN_PROGRESS_MAX = 20;

/** A reading as the aggregate gives it: [id, stage, at (ms), litres, upstream, downstream, flow, temperature]. */
export type InProgressReading = [id: string, stageIndex: number, atMs: number, volumeL: number, upstreamBar: number, downstreamBar: number, flowLh: number | null, tempC: number | null];
/** A correction: [reading id, kind, litres, upstream, downstream, flow, temperature], oldest first. */
export type InProgressCorrection = [readingId: string, kind: 'correct' | 'void', volumeL: number | null, upstreamBar: number | null, downstreamBar: number | null, flowLh: number | null, tempC: number | null];

export type InProgressRow = {
  id: string;
  startedAtMs: number;
  planId: string;
  planName: string;
  plannedDate: string;
  lotId: string;
  lotCode: string;
  lotName: string;
  volumeL: number;
  bottlesPerHour: number | null;
  bottleMl: number | null;
  stages: PlanTrainStage[];
  types: { id: string; name: string; terminalDpBar: number }[];
  readings: InProgressReading[];
  corrections: InProgressCorrection[];
  changes: { stageIndex: number; atVolumeL: number }[];
};

/**
 * The runs in progress of a winery with everything their stages' forecasts need — plan, lot,
 * chosen train, line, the train's cartridge types, every reading, correction and change — in one
 * query (each run's rows aggregated beside it; no query per run).
 */
export function createRunsInProgressRepository(db: DbOrTx) {
  return {
    async inProgress(wineryId: string): Promise<InProgressRow[]> {
      const result = await db.execute(sql`
        select r.id,
               extract(epoch from r.started_at) * 1000 as "startedAtMs",
               p.id as "planId", p.name as "planName", p.planned_date::text as "plannedDate",
               l.id as "lotId", l.code as "lotCode", l.name as "lotName", pl.volume_l as "volumeL",
               ln.bottles_per_hour as "bottlesPerHour", ln.bottle_ml as "bottleMl",
               coalesce(pt.stages, '[]'::jsonb) as stages,
               (select coalesce(json_agg(json_build_object('id', t.id, 'name', t.name, 'terminalDpBar', t.terminal_dp_bar)), '[]'::json)
                  from cartridge_types t
                 where t.winery_id = r.winery_id
                   and t.id::text in (select s->>'cartridgeTypeId' from jsonb_array_elements(coalesce(pt.stages, '[]'::jsonb)) s)) as types,
               (select coalesce(json_agg(json_build_array(rr.id, rr.stage_index, extract(epoch from rr.at) * 1000, rr.volume_l, rr.upstream_bar, rr.downstream_bar, rr.flow_lh, rr.temp_c)
                                         order by rr.stage_index, rr.volume_l, rr.at), '[]'::json)
                  from run_readings rr where rr.run_id = r.id) as readings,
               (select coalesce(json_agg(json_build_array(c.reading_id, c.kind, c.volume_l, c.upstream_bar, c.downstream_bar, c.flow_lh, c.temp_c)
                                         order by c.created_at, c.id), '[]'::json)
                  from run_reading_corrections c where c.run_id = r.id) as corrections,
               (select coalesce(json_agg(json_build_object('stageIndex', ch.stage_index, 'atVolumeL', ch.at_volume_l)), '[]'::json)
                  from run_changes ch where ch.run_id = r.id) as changes
          from runs r
          join plans p on p.id = r.plan_id
          join plan_lots pl on pl.id = r.plan_lot_id
          join lots l on l.id = pl.lot_id
          left join plan_trains pt on pt.id = pl.chosen_train_id and pt.winery_id = r.winery_id
          left join lines ln on ln.id = p.line_id and ln.winery_id = r.winery_id
         where r.winery_id = ${wineryId} and r.status = 'running'
         order by r.started_at, r.id
         limit ${IN_PROGRESS_MAX}`);
      return (result.rows as Record<string, unknown>[]).map((r) => ({
        ...(r as unknown as InProgressRow),
        startedAtMs: Number(r.startedAtMs),
        volumeL: Number(r.volumeL),
        bottlesPerHour: r.bottlesPerHour === null ? null : Number(r.bottlesPerHour),
        bottleMl: r.bottleMl === null ? null : Number(r.bottleMl),
      }));
    },
  };
}
