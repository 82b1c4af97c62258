import { z } from 'zod';
import { readinessThresholdsSchema } from '../engine';
import { orderLeadTimeDaysSchema, timeZoneSchema } from './alerts';

/** Gauge resolution limits, bar: a ΔP rise smaller than this is not counted as fouling. */
export const GAUGE_RESOLUTION_MIN_BAR = 0.001;
export const GAUGE_RESOLUTION_MAX_BAR = 0.5;
export const gaugeResolutionBarSchema = z.coerce
  .number({ error: 'Enter the gauge resolution as a number.' })
  .min(GAUGE_RESOLUTION_MIN_BAR, { error: `At least ${GAUGE_RESOLUTION_MIN_BAR} bar.` })
  .max(GAUGE_RESOLUTION_MAX_BAR, { error: `At most ${GAUGE_RESOLUTION_MAX_BAR} bar.` });

export const updateWinerySettingsInputSchema = z.object({
  name: z.string().trim().min(1, { error: 'Enter the winery name.' }).max(120).optional(),
  /** null restores the defaults. */
  readinessThresholds: readinessThresholdsSchema.nullable().optional(),
  timeZone: timeZoneSchema.optional(),
  orderLeadTimeDays: orderLeadTimeDaysSchema.optional(),
  /** The smallest ΔP step the winery's gauges show, bar (default 0.02). */
  gaugeResolutionBar: gaugeResolutionBarSchema.optional(),
});
export type UpdateWinerySettingsInput = z.infer<typeof updateWinerySettingsInputSchema>;
