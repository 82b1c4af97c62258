// Request schemas of a winery's hose presets: its usual hoses and lines (metric: mm and m), saved
// to pick from when entering a train's hoses. The hose figures follow the train's hose schema.
import { z } from 'zod';
import { trainHoseSchema } from './plans';
import { textSchema } from './text';

export const HOSE_PRESET_NAME_MAX = 60;
export const HOSE_PRESETS_MAX = 100;

const nameSchema = textSchema({ error: 'Enter a name for the hose, e.g. "Tank hose 38 mm".' })
  .trim()
  .min(1, { error: 'Enter a name for the hose, e.g. "Tank hose 38 mm".' })
  .max(HOSE_PRESET_NAME_MAX, { error: `Hose names are at most ${HOSE_PRESET_NAME_MAX} characters.` });

export const createHosePresetInputSchema = trainHoseSchema.extend({ name: nameSchema });
export type CreateHosePresetInput = z.input<typeof createHosePresetInputSchema>;
export type HosePresetValues = z.output<typeof createHosePresetInputSchema>;

export const updateHosePresetInputSchema = createHosePresetInputSchema
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Change at least one field.' });
export type UpdateHosePresetInput = z.input<typeof updateHosePresetInputSchema>;
