/**
 * How the screening map draws a parcel's level: the level's tone as a pale wash plus a pattern of
 * its own (none, dots, hatch, cross), and a heavier outline as the level rises, so levels differ
 * without colour. The legend (ScreeningLegend) draws the same swatches.
 */
import type { Pattern } from '~/lib/gis/reference-kinds';
import type { RiskLevel } from '~/lib/rules/levels';

export const LEVEL_LOOK: Record<RiskLevel, { colour: string; pattern: Pattern; width: number }> = {
  1: { colour: '#2f6b4f', pattern: 'solid', width: 1 },
  2: { colour: '#1f5a85', pattern: 'dots', width: 1.5 },
  3: { colour: '#6b4a2b', pattern: 'hatch', width: 2 },
  4: { colour: '#9a3b17', pattern: 'cross', width: 3 },
};
