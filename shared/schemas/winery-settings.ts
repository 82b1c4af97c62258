import { z } from 'zod';
import { readinessThresholdsSchema } from '../engine/readiness';

export const updateWinerySettingsInputSchema = z.object({
  name: z.string().trim().min(1, { error: 'Enter the winery name.' }).max(120).optional(),
  /** null restores the defaults. */
  readinessThresholds: readinessThresholdsSchema.nullable().optional(),
});
export type UpdateWinerySettingsInput = z.infer<typeof updateWinerySettingsInputSchema>;
