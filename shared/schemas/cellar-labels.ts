// Words for the cellar's stored values, for display. No zod here: a page that only shows
// these words (Today) should not load the validator with them.
import type { WineStyle } from '../engine';

export const wineStyleLabels: Record<WineStyle, string> = {
  white: 'White',
  'rosé': 'Rosé',
  red: 'Red',
  sweet: 'Sweet',
  sparkling: 'Sparkling',
};
