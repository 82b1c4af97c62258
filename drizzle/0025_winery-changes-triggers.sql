-- A winery's data version (winery_changes, 0024): every statement that writes a table of winery
-- data leaves one row per (winery, transaction), whoever writes (the app, an import, a script,
-- psql). Statement triggers with transition tables: one small insert per statement, however many
-- rows it wrote; ON CONFLICT DO NOTHING, so a transaction's later statements add nothing and two
-- transactions never wait for each other (their keys differ). Not here, on purpose: stored
-- figures worked out on reading (run_figures, run_stage_learnings, cartridge_life_flags: they
-- follow the data they were worked out from), sessions, sign-in and reset tokens, idempotency
-- keys, rate-limit counters and calendar feed tokens (none of them winery data).
CREATE OR REPLACE FUNCTION winery_changed_new() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO winery_changes (winery_id, txid)
  SELECT DISTINCT n.winery_id, txid_current() FROM new_rows n WHERE n.winery_id IS NOT NULL
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION winery_changed_both() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO winery_changes (winery_id, txid)
  SELECT x.winery_id, txid_current() FROM (SELECT n.winery_id FROM new_rows n UNION SELECT o.winery_id FROM old_rows o) x WHERE x.winery_id IS NOT NULL
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION winery_changed_old() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO winery_changes (winery_id, txid)
  SELECT DISTINCT o.winery_id, txid_current() FROM old_rows o WHERE o.winery_id IS NOT NULL
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
-- The winery row itself (name, settings, thresholds): its id is the winery.
CREATE OR REPLACE FUNCTION winery_row_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO winery_changes (winery_id, txid)
  SELECT x.id, txid_current() FROM (SELECT n.id FROM new_rows n UNION SELECT o.id FROM old_rows o) x
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
-- A person's name shows in every winery they belong to (who logged, who approved).
CREATE OR REPLACE FUNCTION winery_member_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO winery_changes (winery_id, txid)
  SELECT DISTINCT m.winery_id, txid_current() FROM new_rows n JOIN memberships m ON m.user_id = n.id
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER wineries_changed_update AFTER UPDATE ON wineries
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_row_changed();
--> statement-breakpoint
CREATE TRIGGER users_changed_update AFTER UPDATE ON users
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_member_changed();--> statement-breakpoint
CREATE TRIGGER alert_preferences_winery_changed_insert AFTER INSERT ON alert_preferences
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER alert_preferences_winery_changed_update AFTER UPDATE ON alert_preferences
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER alert_preferences_winery_changed_delete AFTER DELETE ON alert_preferences
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER alerts_winery_changed_insert AFTER INSERT ON alerts
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER alerts_winery_changed_update AFTER UPDATE ON alerts
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER alerts_winery_changed_delete AFTER DELETE ON alerts
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER attachments_winery_changed_insert AFTER INSERT ON attachments
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER attachments_winery_changed_update AFTER UPDATE ON attachments
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER attachments_winery_changed_delete AFTER DELETE ON attachments
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER audit_events_winery_changed_insert AFTER INSERT ON audit_events
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER audit_events_winery_changed_update AFTER UPDATE ON audit_events
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER audit_events_winery_changed_delete AFTER DELETE ON audit_events
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_winery_changed_insert AFTER INSERT ON cartridge_events
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_winery_changed_update AFTER UPDATE ON cartridge_events
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_winery_changed_delete AFTER DELETE ON cartridge_events
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER cartridge_types_winery_changed_insert AFTER INSERT ON cartridge_types
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER cartridge_types_winery_changed_update AFTER UPDATE ON cartridge_types
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER cartridge_types_winery_changed_delete AFTER DELETE ON cartridge_types
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER cartridges_winery_changed_insert AFTER INSERT ON cartridges
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER cartridges_winery_changed_update AFTER UPDATE ON cartridges
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER cartridges_winery_changed_delete AFTER DELETE ON cartridges
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER hose_presets_winery_changed_insert AFTER INSERT ON hose_presets
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER hose_presets_winery_changed_update AFTER UPDATE ON hose_presets
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER hose_presets_winery_changed_delete AFTER DELETE ON hose_presets
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER housings_winery_changed_insert AFTER INSERT ON housings
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER housings_winery_changed_update AFTER UPDATE ON housings
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER housings_winery_changed_delete AFTER DELETE ON housings
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER invitations_winery_changed_insert AFTER INSERT ON invitations
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER invitations_winery_changed_update AFTER UPDATE ON invitations
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER invitations_winery_changed_delete AFTER DELETE ON invitations
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER lab_results_winery_changed_insert AFTER INSERT ON lab_results
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER lab_results_winery_changed_update AFTER UPDATE ON lab_results
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER lab_results_winery_changed_delete AFTER DELETE ON lab_results
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER lines_winery_changed_insert AFTER INSERT ON lines
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER lines_winery_changed_update AFTER UPDATE ON lines
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER lines_winery_changed_delete AFTER DELETE ON lines
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER logger_imports_winery_changed_insert AFTER INSERT ON logger_imports
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER logger_imports_winery_changed_update AFTER UPDATE ON logger_imports
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER logger_imports_winery_changed_delete AFTER DELETE ON logger_imports
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER logger_profiles_winery_changed_insert AFTER INSERT ON logger_profiles
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER logger_profiles_winery_changed_update AFTER UPDATE ON logger_profiles
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER logger_profiles_winery_changed_delete AFTER DELETE ON logger_profiles
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER lots_winery_changed_insert AFTER INSERT ON lots
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER lots_winery_changed_update AFTER UPDATE ON lots
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER lots_winery_changed_delete AFTER DELETE ON lots
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER mail_failures_winery_changed_insert AFTER INSERT ON mail_failures
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER mail_failures_winery_changed_update AFTER UPDATE ON mail_failures
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER mail_failures_winery_changed_delete AFTER DELETE ON mail_failures
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER memberships_winery_changed_insert AFTER INSERT ON memberships
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER memberships_winery_changed_update AFTER UPDATE ON memberships
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER memberships_winery_changed_delete AFTER DELETE ON memberships
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER notifications_winery_changed_insert AFTER INSERT ON notifications
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER notifications_winery_changed_update AFTER UPDATE ON notifications
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER notifications_winery_changed_delete AFTER DELETE ON notifications
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER plan_lots_winery_changed_insert AFTER INSERT ON plan_lots
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER plan_lots_winery_changed_update AFTER UPDATE ON plan_lots
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER plan_lots_winery_changed_delete AFTER DELETE ON plan_lots
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER plan_trains_winery_changed_insert AFTER INSERT ON plan_trains
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER plan_trains_winery_changed_update AFTER UPDATE ON plan_trains
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER plan_trains_winery_changed_delete AFTER DELETE ON plan_trains
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER plans_winery_changed_insert AFTER INSERT ON plans
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER plans_winery_changed_update AFTER UPDATE ON plans
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER plans_winery_changed_delete AFTER DELETE ON plans
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER run_changes_winery_changed_insert AFTER INSERT ON run_changes
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER run_changes_winery_changed_update AFTER UPDATE ON run_changes
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER run_changes_winery_changed_delete AFTER DELETE ON run_changes
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_winery_changed_insert AFTER INSERT ON run_reading_corrections
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_winery_changed_update AFTER UPDATE ON run_reading_corrections
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_winery_changed_delete AFTER DELETE ON run_reading_corrections
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER run_readings_winery_changed_insert AFTER INSERT ON run_readings
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER run_readings_winery_changed_update AFTER UPDATE ON run_readings
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER run_readings_winery_changed_delete AFTER DELETE ON run_readings
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER run_stage_cartridges_winery_changed_insert AFTER INSERT ON run_stage_cartridges
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER run_stage_cartridges_winery_changed_update AFTER UPDATE ON run_stage_cartridges
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER run_stage_cartridges_winery_changed_delete AFTER DELETE ON run_stage_cartridges
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER runs_winery_changed_insert AFTER INSERT ON runs
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER runs_winery_changed_update AFTER UPDATE ON runs
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER runs_winery_changed_delete AFTER DELETE ON runs
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
CREATE TRIGGER tanks_winery_changed_insert AFTER INSERT ON tanks
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_new();
--> statement-breakpoint
CREATE TRIGGER tanks_winery_changed_update AFTER UPDATE ON tanks
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_both();
--> statement-breakpoint
CREATE TRIGGER tanks_winery_changed_delete AFTER DELETE ON tanks
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION winery_changed_old();
--> statement-breakpoint
-- Folds the rows into the per-winery counts in one statement (one snapshot): a reader sees the
-- rows or the count they went into, never both or neither. Rows of transactions still running
-- are not seen, so not folded; they count once they commit.
CREATE OR REPLACE FUNCTION fold_winery_changes() RETURNS bigint
LANGUAGE sql AS $$
  WITH moved AS (DELETE FROM winery_changes RETURNING winery_id),
  added AS (
    INSERT INTO winery_change_counts (winery_id, n)
    SELECT winery_id, count(*) FROM moved GROUP BY winery_id
    ON CONFLICT (winery_id) DO UPDATE SET n = winery_change_counts.n + excluded.n
    RETURNING 1
  )
  SELECT count(*) FROM moved;
$$;
