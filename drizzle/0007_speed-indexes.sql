CREATE INDEX "cartridge_events_cartridge_kind_idx" ON "cartridge_events" USING btree ("cartridge_id","kind");--> statement-breakpoint
CREATE INDEX "cartridges_winery_received_idx" ON "cartridges" USING btree ("winery_id","received_at","id");--> statement-breakpoint
CREATE INDEX "cartridges_serial_trgm_idx" ON "cartridges" USING gin ("serial" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "cartridges_batch_trgm_idx" ON "cartridges" USING gin ("batch" gin_trgm_ops);