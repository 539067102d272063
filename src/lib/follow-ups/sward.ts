/** Which recorded land-use events end a compensation parcel's time in grass (pure). */
import { EVENT_VALUES } from '../gis/land-use-events';
import { DEFAULT_GRASSLAND_USES } from '../gis/land-use-history';
import { SWARD_BREAKING_TILLAGE } from './settings';

/** Tillage that breaks the sward, or a land use that is no longer grass: words for it, or null when the grass stays. */
export function swardBroken(kind: string, value: string | null): string | null {
  if (kind === 'tillage' && value && SWARD_BREAKING_TILLAGE.includes(value))
    return EVENT_VALUES.tillage[value]!.toLowerCase();
  if (kind === 'land-use' && value && !DEFAULT_GRASSLAND_USES.includes(value))
    return `a change of use to ${(EVENT_VALUES['land-use'][value] ?? value).toLowerCase()}`;
  return null;
}
