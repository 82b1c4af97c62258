import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { double, tenantColumns } from './columns';

export const housingsTable = pgTable(
  'housings',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    rounds: integer('rounds').notNull(),
    lengthIn: integer('length_in').notNull(),
    maxPressureBar: double('max_pressure_bar').notNull(),
    maxTempC: double('max_temp_c').notNull(),
    holdUpL: double('hold_up_l').notNull(),
    upstreamGasVolumeL: double('upstream_gas_volume_l'),
    notes: text('notes').notNull().default(''),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('housings_winery_name_uq').on(t.wineryId, t.name)],
);

export const linesTable = pgTable(
  'lines',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    bottlesPerHour: double('bottles_per_hour').notNull(),
    bottleMl: double('bottle_ml').notNull(),
    notes: text('notes').notNull().default(''),
  },
  (t) => [uniqueIndex('lines_winery_name_uq').on(t.wineryId, t.name)],
);

export const cartridgeKinds = ['prefilter', 'membrane'] as const;
export const cartridgeMedia = ['polypropylene', 'glass fibre', 'PES', 'PVDF', 'nylon', 'other'] as const;

export const cartridgeTypesTable = pgTable(
  'cartridge_types',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    kind: text('kind', { enum: cartridgeKinds }).notNull(),
    media: text('media', { enum: cartridgeMedia }).notNull(),
    ratingUm: double('rating_um').notNull(),
    areaM2Per10in: double('area_m2_per_10in').notNull(),
    waterFlowLhPer10in: double('water_flow_lh_per_10in').notNull(),
    waterDpBar: double('water_dp_bar').notNull(),
    maxDpForwardBar: double('max_dp_forward_bar').notNull(),
    maxDpReverseBar: double('max_dp_reverse_bar'),
    maxTempC: double('max_temp_c').notNull(),
    terminalDpBar: double('terminal_dp_bar').notNull(),
    designFluxLhPer10in: double('design_flux_lh_per_10in').notNull(),
    /** The maker's or the winery's usual litres per m² to terminal ΔP for an average wine (the last capacity source of a plan stage). */
    nominalCapacityLPerM2: double('nominal_capacity_l_per_m2'),
    ratedSteamCycles: integer('rated_steam_cycles'),
    ratedHotWaterCycles: integer('rated_hot_water_cycles'),
    ratedChemicalCycles: integer('rated_chemical_cycles'),
    flowRecoveryMinPct: double('flow_recovery_min_pct').notNull().default(70),
    bubblePointMinBar: double('bubble_point_min_bar'),
    diffusionMaxMlMinPer10in: double('diffusion_max_ml_min_per_10in'),
    pricePer10in: double('price_per_10in'),
    currency: text('currency').notNull().default('EUR'),
    certificateAttachmentId: uuid('certificate_attachment_id'),
    notes: text('notes').notNull().default(''),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('cartridge_types_winery_name_uq').on(t.wineryId, t.name), index('cartridge_types_winery_kind_idx').on(t.wineryId, t.kind)],
);
