/** A rule's threshold in plain words for the admin and assessment pages (pure). */
import { fmtHa, fmtPct, fmtT, fmtT1 } from './format';
import type { Rule } from './schema';

export function thresholdText(r: Rule): string {
  switch (r.kind) {
    case 'sensitive-share':
      return `Any parcel with more than ${fmtPct(r.params.aboveShare)} of its assessed area in designated sensitive grassland.`;
    case 'region-ratio-fall':
      return (
        `The region's permanent-grassland ratio after the proposal falls more ` +
        `than ${fmtPct(r.params.aboveRelativeFall)} (relative) below its reference ratio.`
      );
    case 'holding-cumulative-area':
      return (
        `Permanent grassland converted on one holding reaches ${fmtHa(r.params.atLeastHa)} or more, this ` +
        `proposal and earlier ones within ${r.params.windowYears} years added together.`
      );
    case 'never-tilled':
      return (
        `${r.params.useFlag ? 'The recorded history shows no tillage or arable use, or m' : 'M'}ore ` +
        `than ${fmtPct(r.params.aboveShare)} of a parcel lies in mapped never-tilled grassland.`
      );
    case 'slope-class':
      return `More than ${fmtPct(r.params.aboveShare)} of a parcel lies in slope class ${r.params.classes.map((c) => `"${c}"`).join(' or ')}.`;
    case 'soc-loss-per-ha':
      return `Soil-carbon loss above ${fmtT1(r.params.aboveTonnesCPerHa)} t C/ha, averaged over the assessed area.`;
    case 'co2e-total':
      return `${r.params.basis === 'upper' ? 'The upper bound of the 95 % range of the total' : 'The total'} above ${fmtT(r.params.aboveTonnesCo2e)} t CO2e.`;
    case 'budget-share':
      return `The proposal would use more than ${fmtPct(r.params.aboveShare)} of the year's carbon budget.`;
  }
}
