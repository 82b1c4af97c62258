import { sql } from 'drizzle-orm';
import { writeCacheWithoutWaiting, type DbOrTx } from '../../db/client';
import { runFiguresTable, type PlanTrainStage } from '../../db/schema';

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
  /** The run's figures version (0 before any row), read before anything the figures are worked out from. */
  figuresVersion: number;
  /** Today's stored entry and its key, when worked out at that version; else null. */
  todayKey: string | null;
  today: unknown;
};

/** What a run's figures on Today are worked out from besides the small inputs: every reading, correction and change. */
export type InProgressData = {
  readings: InProgressReading[];
  corrections: InProgressCorrection[];
  changes: { stageIndex: number; atVolumeL: number }[];
};

/**
 * The runs in progress of a winery with the small inputs of their stages' figures (plan, lot,
 * chosen train, line, the train's cartridge types) and their stored Today entries, in one
 * query; the readings, corrections and changes of the runs whose entry must be worked out
 * again in a second one (each run's rows aggregated beside it; no query per run).
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
               coalesce(f.version, 0) as "figuresVersion",
               case when f.today_version = f.version then f.today_key end as "todayKey",
               case when f.today_version = f.version then f.today end as today
          from runs r
          join plans p on p.id = r.plan_id
          join plan_lots pl on pl.id = r.plan_lot_id
          join lots l on l.id = pl.lot_id
          left join plan_trains pt on pt.id = pl.chosen_train_id and pt.winery_id = r.winery_id
          left join lines ln on ln.id = p.line_id and ln.winery_id = r.winery_id
          left join ${runFiguresTable} f on f.run_id = r.id
         where r.winery_id = ${wineryId} and r.status = 'running'
         order by r.started_at, r.id
         limit ${IN_PROGRESS_MAX}`);
      return (result.rows as Record<string, unknown>[]).map((r) => ({
        ...(r as unknown as InProgressRow),
        startedAtMs: Number(r.startedAtMs),
        volumeL: Number(r.volumeL),
        bottlesPerHour: r.bottlesPerHour === null ? null : Number(r.bottlesPerHour),
        bottleMl: r.bottleMl === null ? null : Number(r.bottleMl),
        figuresVersion: Number(r.figuresVersion),
        today: r.today ?? null,
      }));
    },

    /** Every reading (stage, litres, time order), correction (oldest first) and change of these runs. */
    async dataOf(runIds: string[]): Promise<Map<string, InProgressData>> {
      if (runIds.length === 0) return new Map();
      const result = await db.execute(sql`
        select r.id,
               (select coalesce(json_agg(json_build_array(rr.id, rr.stage_index, extract(epoch from rr.at) * 1000, rr.volume_l, rr.upstream_bar, rr.downstream_bar, rr.flow_lh, rr.temp_c)
                                         order by rr.stage_index, rr.volume_l, rr.at), '[]'::json)
                  from run_readings rr where rr.run_id = r.id) as readings,
               (select coalesce(json_agg(json_build_array(c.reading_id, c.kind, c.volume_l, c.upstream_bar, c.downstream_bar, c.flow_lh, c.temp_c)
                                         order by c.created_at, c.id), '[]'::json)
                  from run_reading_corrections c where c.run_id = r.id) as corrections,
               (select coalesce(json_agg(json_build_object('stageIndex', ch.stage_index, 'atVolumeL', ch.at_volume_l)), '[]'::json)
                  from run_changes ch where ch.run_id = r.id) as changes
          from runs r
         where r.id = any(${sql.param(runIds)}::uuid[])`);
      return new Map((result.rows as (InProgressData & { id: string })[]).map(({ id, ...data }) => [id, data]));
    },

    /**
     * Stores Today's entries, each only if its run's version is still the one it was read at (a
     * write in between leaves it as it was, to be worked out again by the next visit). Each
     * entry is JSON text, kept as written.
     */
    async storeToday(entries: { runId: string; version: number; key: string; today: string }[]) {
      if (entries.length === 0) return;
      const col = <T>(pick: (e: (typeof entries)[number]) => T) => sql.param(entries.map(pick));
      // Never queues behind a long write of a run (a logger import): skipped, the next visit stores it.
      await writeCacheWithoutWaiting(db, (tx) => tx.execute(sql`
        insert into ${runFiguresTable} (run_id, version, today_version, today_key, today)
        select x.run_id, x.version, x.version, x.key, x.today::json
          from unnest(${col((e) => e.runId)}::uuid[], ${col((e) => e.version)}::int[], ${col((e) => e.key)}::text[], ${col((e) => e.today)}::text[]) as x(run_id, version, key, today)
         order by x.run_id
        on conflict (run_id) do update
          set today_version = excluded.today_version, today_key = excluded.today_key, today = excluded.today
          where ${runFiguresTable}.version = excluded.version`));
    },
  };
}
