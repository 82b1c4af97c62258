import { z } from 'zod';
import { readinessThresholdsSchema } from '../engine/readiness';
import { orderLeadTimeDaysSchema, timeZoneSchema } from './alerts';

export const updateWinerySettingsInputSchema = z.object({
  name: z.string().trim().min(1, { error: 'Enter the winery name.' }).max(120).optional(),
  /** null restores the defaults. */
  readinessThresholds: readinessThresholdsSchema.nullable().optional(),
  timeZone: timeZoneSchema.optional(),
  orderLeadTimeDays: orderLeadTimeDaysSchema.optional(),
});
export type UpdateWinerySettingsInput = z.infer<typeof updateWinerySettingsInputSchema>;
