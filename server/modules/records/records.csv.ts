import type { FilterRecordDto } from '../../../shared/types/records';
import { csvSafeStringify } from '../../lib/csv';

/**
 * The record as CSV: one table per section, one after the other. Every row starts with its
 * section's name, and each section opens with a row naming its columns (first cell
 * "<section> columns"), so a spreadsheet can filter by the first column. Every text cell is
 * neutralised against formula injection.
 */
export function recordCsv(r: FilterRecordDto): string {
  const rows: unknown[][] = [];
  const section = (name: string, columns: string[], data: unknown[][]) => {
    rows.push([`${name} columns`, ...columns]);
    for (const d of data) rows.push([name, ...d]);
  };
  section('record', ['fingerprint_sha256', 'generated_at', 'lot_code', 'lot_name', 'style', 'vintage', 'lot_volume_l'], [
    [r.fingerprint, r.generatedAt, r.lot.code, r.lot.name, r.lot.style, r.lot.vintage, r.lot.volumeL],
  ]);
  section(
    'run',
    ['run_id', 'status', 'started_at', 'started_by', 'closed_at', 'closed_by', 'volume_filtered_l', 'bottles', 'bottle_ml', 'plan', 'planned_date', 'train', 'line', 'approved_at', 'approved_by', 'override_reason', 'override_by', 'readiness', 'readiness_reasons', 'sampled_at', 'turbidity_ntu', 'clogging_index_s', 'vmax_l_per_m2', 'closing_notes', 'readiness_source', 'readiness_thresholds_default', 'readiness_turbidity_limit_ntu', 'readiness_turbidity_borderline_margin_ntu', 'readiness_ci_ready_max_s', 'readiness_ci_borderline_max_s', 'readiness_ci_valid_below_ntu', 'readiness_vmax_ready_min_factor', 'readiness_vmax_borderline_min_factor', 'readiness_note'],
    r.runs.map((x) => [
      x.id, x.status, x.startedAt, x.startedByName, x.closedAt, x.closedByName, x.volumeFilteredL, x.bottles, x.plan.bottleMl, x.plan.name, x.plan.plannedDate, x.plan.trainName, x.plan.lineName,
      x.plan.approvedAt, x.plan.approvedByName, x.overrideReason, x.overrideByName, x.readiness.verdict, x.readiness.reasons.join(' '), x.analyses?.sampledAt ?? null, x.analyses?.turbidityNtu ?? null,
      x.analyses?.cloggingIndex ?? null, x.analyses?.vmaxLPerM2 ?? null, x.notes,
      // the readiness thresholds the verdict was judged against (kept at the start, or the current ones with a note)
      x.readiness.source, x.readiness.thresholds.isDefault, x.readiness.thresholds.turbidity.limitNtu, x.readiness.thresholds.turbidity.borderlineMarginNtu,
      x.readiness.thresholds.cloggingIndex.readyMaxS, x.readiness.thresholds.cloggingIndex.borderlineMaxS, x.readiness.thresholds.cloggingIndexValidity.validBelowNtu,
      x.readiness.thresholds.vmax.readyMinSafetyFactor, x.readiness.thresholds.vmax.borderlineMinSafetyFactor, x.readiness.note,
    ]),
  );
  section(
    'sized_stage',
    ['run_id', 'stage', 'name', 'kind', 'rating_um', 'cartridges', 'area_m2', 'flux_l_per_m2_h', 'clean_dp_bar', 'terminal_dp_bar', 'capacity_l', 'sets_used'],
    r.runs.flatMap((x) => (x.plan.sizing?.stages ?? []).map((s) => [x.id, s.index + 1, s.name, s.kind, s.ratingUm, s.cartridgeCount, s.areaM2, s.fluxLmh, s.cleanDpBar, s.terminalDpBar, s.capacityL, s.setsUsed])),
  );
  section(
    'cartridge',
    ['run_id', 'stage', 'housing', 'serial', 'batch', 'type', 'kind', 'rating_um', 'length_in', 'litres_carried', 'litres_at_start', 'steam_cycles_at_start', 'hot_water_cycles_at_start', 'chemical_cycles_at_start', 'installed_at_volume_l', 'removed_at_volume_l'],
    r.runs.flatMap((x) =>
      x.stages.flatMap((s) =>
        s.cartridges.map((c) => [x.id, s.index + 1, s.housingName, c.serial, c.batch, c.typeName, c.kind, c.ratingUm, c.lengthIn, c.litresCarried, c.litresAtStart, c.cyclesAtStart.steam, c.cyclesAtStart.hotWater, c.cyclesAtStart.chemical, c.installedAtVolumeL, c.removedAtVolumeL]),
      ),
    ),
  );
  section(
    'change',
    ['run_id', 'stage', 'kind', 'at_volume_l', 'removed_serials', 'installed_serials', 'by', 'at'],
    r.runs.flatMap((x) => x.stages.flatMap((s) => s.changes.map((c) => [x.id, s.index + 1, c.kind, c.atVolumeL, c.removedSerials.join(' '), c.installedSerials.join(' '), c.byName, c.at]))),
  );
  section(
    'sanitation',
    ['run_id', 'stage', 'serial', 'cycle', 'temp_c', 'duration_min', 'agent', 'by', 'at'],
    r.runs.flatMap((x) => x.stages.flatMap((s) => s.sanitation.map((c) => [x.id, s.index + 1, c.serial, c.kind, c.tempC, c.durationMin, c.agent, c.byName, c.at]))),
  );
  section(
    'integrity',
    ['run_id', 'stage', 'when', 'serial', 'test', 'measured', 'limit', 'limit_kind', 'unit', 'result', 'by', 'at'],
    r.runs.flatMap((x) =>
      x.stages.flatMap((s) =>
        (['before', 'after'] as const).flatMap((w) =>
          (s.integrity?.[w] ?? []).map((t) => [x.id, s.index + 1, w, t.serial, t.test, t.measured, t.limit, t.limitKind, t.unit, t.pass ? 'pass' : 'fail', t.byName, t.at]),
        ),
      ),
    ),
  );
  section(
    'integrity_statement',
    ['run_id', 'stage', 'status', 'statement'],
    r.runs.flatMap((x) => x.stages.filter((s) => s.integrity).map((s) => [x.id, s.index + 1, s.integrity!.status, s.integrity!.statement])),
  );
  section(
    'reading',
    ['run_id', 'stage', 'reading_id', 'at', 'volume_l', 'upstream_bar', 'downstream_bar', 'dp_bar', 'flow_lh', 'temp_c', 'by', 'voided', 'corrections'],
    r.runs.flatMap((x) =>
      x.stages.flatMap((s) =>
        s.readings.map((d) => [x.id, s.index + 1, d.id, d.at, d.volumeL, d.upstreamBar, d.downstreamBar, d.dpBar, d.flowLh, d.tempC, d.byName, d.voided ? 'yes' : 'no', d.corrections.length]),
      ),
    ),
  );
  section(
    'correction',
    ['run_id', 'stage', 'reading_id', 'kind', 'volume_l', 'upstream_bar', 'downstream_bar', 'flow_lh', 'temp_c', 'reason', 'by', 'at'],
    r.runs.flatMap((x) =>
      x.stages.flatMap((s) => s.readings.flatMap((d) => d.corrections.map((c) => [x.id, s.index + 1, d.id, c.kind, c.volumeL, c.upstreamBar, c.downstreamBar, c.flowLh, c.tempC, c.reason, c.byName, c.at]))),
    ),
  );
  section(
    'fit',
    ['run_id', 'stage', 'law', 'clean_dp_bar', 'k_per_l', 'r2', 'readings', 'final_dp_bar', 'terminal_dp_bar', 'note'],
    r.runs.flatMap((x) => x.stages.map((s) => [x.id, s.index + 1, s.fit?.law ?? null, s.fit?.dp0Bar ?? null, s.fit?.kPerL ?? null, s.fit?.r2 ?? null, s.fit?.n ?? null, s.finalDpBar, s.terminalDpBar, s.fitNote])),
  );
  return csvSafeStringify(rows);
}
