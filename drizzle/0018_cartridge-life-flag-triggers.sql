-- Today's stored life check (cartridge_life_flags, 0016) goes stale whenever something the
-- life forecast reads changes; these triggers raise the cartridge's version in the same
-- transaction, whoever writes (the app, an import, a script). Ids are taken in order so two
-- writers never wait for each other's rows the other way round.
CREATE OR REPLACE FUNCTION cartridge_life_flags_bump(ids uuid[]) RETURNS void
LANGUAGE sql AS $$
  INSERT INTO cartridge_life_flags (cartridge_id, version)
  SELECT id, 1 FROM (SELECT DISTINCT unnest(ids) AS id) x WHERE id IS NOT NULL ORDER BY id
  ON CONFLICT (cartridge_id) DO UPDATE SET version = cartridge_life_flags.version + 1;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cartridge_life_flags_events_new() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  PERFORM cartridge_life_flags_bump(ARRAY(SELECT cartridge_id FROM new_rows));
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cartridge_life_flags_events_old() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  -- a cartridge being deleted takes its events first: no flag row for a cartridge that is gone
  PERFORM cartridge_life_flags_bump(ARRAY(SELECT o.cartridge_id FROM old_rows o WHERE EXISTS (SELECT 1 FROM cartridges c WHERE c.id = o.cartridge_id)));
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER cartridge_events_life_insert AFTER INSERT ON cartridge_events
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION cartridge_life_flags_events_new();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_life_update AFTER UPDATE ON cartridge_events
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION cartridge_life_flags_events_new();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_life_update_old AFTER UPDATE ON cartridge_events
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION cartridge_life_flags_events_old();
--> statement-breakpoint
CREATE TRIGGER cartridge_events_life_delete AFTER DELETE ON cartridge_events
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION cartridge_life_flags_events_old();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cartridge_life_flags_cartridge() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  PERFORM cartridge_life_flags_bump(ARRAY[NEW.id]);
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER cartridges_life_update AFTER UPDATE ON cartridges FOR EACH ROW
  WHEN (OLD.litres_filtered IS DISTINCT FROM NEW.litres_filtered OR OLD.length_in IS DISTINCT FROM NEW.length_in OR OLD.type_id IS DISTINCT FROM NEW.type_id)
  EXECUTE FUNCTION cartridge_life_flags_cartridge();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cartridge_life_flags_type() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  PERFORM cartridge_life_flags_bump(ARRAY(SELECT id FROM cartridges WHERE type_id = NEW.id));
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER cartridge_types_life_update AFTER UPDATE ON cartridge_types FOR EACH ROW
  WHEN (OLD.rated_steam_cycles IS DISTINCT FROM NEW.rated_steam_cycles
     OR OLD.rated_hot_water_cycles IS DISTINCT FROM NEW.rated_hot_water_cycles
     OR OLD.rated_chemical_cycles IS DISTINCT FROM NEW.rated_chemical_cycles
     OR OLD.flow_recovery_min_pct IS DISTINCT FROM NEW.flow_recovery_min_pct
     OR OLD.water_flow_lh_per_10in IS DISTINCT FROM NEW.water_flow_lh_per_10in
     OR OLD.water_dp_bar IS DISTINCT FROM NEW.water_dp_bar)
  EXECUTE FUNCTION cartridge_life_flags_type();
