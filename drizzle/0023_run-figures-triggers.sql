-- A run's stored figures (run_figures, 0022) go stale whenever something they were worked out
-- from changes; these triggers raise the run's version in the same statement, whoever writes
-- (the app, the logger import, a script). The small inputs read on every request anyway (the
-- run's status and litres, the plan lot's volume, the train's stages, the cartridge types'
-- terminal ΔP, the line, the gauge resolution) are not here: each stored entry keeps them as
-- its key and is used only when they still match. Statement triggers with transition tables:
-- one small upsert per statement and run, however many rows it wrote. Ids are taken in order so
-- two writers never wait for each other's rows the other way round.
-- (Each function holds its own upsert: PL/pgSQL keeps the plan, a SQL function would plan it on every call.)
CREATE OR REPLACE FUNCTION run_figures_rows_new() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO run_figures (run_id, version)
  SELECT DISTINCT n.run_id, 1 FROM new_rows n ORDER BY 1
  ON CONFLICT (run_id) DO UPDATE SET version = run_figures.version + 1;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION run_figures_rows_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO run_figures (run_id, version)
  SELECT x.run_id, 1 FROM (SELECT n.run_id FROM new_rows n UNION SELECT o.run_id FROM old_rows o) x ORDER BY 1
  ON CONFLICT (run_id) DO UPDATE SET version = run_figures.version + 1;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION run_figures_rows_old() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  -- no row for a run that is gone
  INSERT INTO run_figures (run_id, version)
  SELECT DISTINCT o.run_id, 1 FROM old_rows o WHERE EXISTS (SELECT 1 FROM runs r WHERE r.id = o.run_id) ORDER BY 1
  ON CONFLICT (run_id) DO UPDATE SET version = run_figures.version + 1;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_readings_figures_insert AFTER INSERT ON run_readings
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_new();
--> statement-breakpoint
CREATE TRIGGER run_readings_figures_update AFTER UPDATE ON run_readings
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_changed();
--> statement-breakpoint
CREATE TRIGGER run_readings_figures_delete AFTER DELETE ON run_readings
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_old();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_figures_insert AFTER INSERT ON run_reading_corrections
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_new();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_figures_update AFTER UPDATE ON run_reading_corrections
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_changed();
--> statement-breakpoint
CREATE TRIGGER run_reading_corrections_figures_delete AFTER DELETE ON run_reading_corrections
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_old();
--> statement-breakpoint
CREATE TRIGGER run_changes_figures_insert AFTER INSERT ON run_changes
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_new();
--> statement-breakpoint
CREATE TRIGGER run_changes_figures_update AFTER UPDATE ON run_changes
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_changed();
--> statement-breakpoint
CREATE TRIGGER run_changes_figures_delete AFTER DELETE ON run_changes
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION run_figures_rows_old();
--> statement-breakpoint
-- A reading kept without a name shows its author's current name (users.name): a rename changes
-- what those runs' pages show. (A user removed sets created_by to null: an update of the
-- readings, caught above.)
CREATE OR REPLACE FUNCTION run_figures_user_renamed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO run_figures (run_id, version)
  SELECT DISTINCT x.run_id, 1 FROM run_readings x WHERE x.created_by = NEW.id AND x.created_by_name IS NULL ORDER BY 1
  ON CONFLICT (run_id) DO UPDATE SET version = run_figures.version + 1;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER users_run_figures_rename AFTER UPDATE OF name ON users FOR EACH ROW
  WHEN (OLD.name IS DISTINCT FROM NEW.name)
  EXECUTE FUNCTION run_figures_user_renamed();
