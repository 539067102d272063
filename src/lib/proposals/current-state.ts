/**
 * A parcel's state for the estimate, from its recorded land use and management (pure). The
 * register records uses in the trade's words (pasture, meadow, arable ...); the engine needs
 * the IPCC categories of 2006 Vol 4 Ch 5 Table 5.5 and Ch 6 Table 6.2. Where the record says
 * the use but not the IPCC management level, the usual default is taken and said so; where it
 * does not say the use at all, nothing is guessed: the assessor chooses, with a reason.
 */
import type { LandUseState } from '../carbon';
import { DEFAULT_GRASSLAND_USES } from '../gis/land-use-history';

export type RecordedState = { state: LandUseState; note: string } | { state: null; note: string };

const GRAZING_OR_CUTTING = ['grazed', 'cut-for-silage', 'hay', 'mixed', 'ungrazed', null];

export function stateFromRecord(landUse: string | null, management: string | null): RecordedState {
  const use = landUse?.toLowerCase() ?? null;
  const mg = management?.toLowerCase() ?? null;
  if (use && DEFAULT_GRASSLAND_USES.includes(use)) {
    if (!GRAZING_OR_CUTTING.includes(mg)) {
      return {
        state: null,
        note:
          `Recorded as ${use} with "${mg}"; the record does not say whether the grassland is improved, nominal ` +
          `or degraded (IPCC 2006 Vol 4 Ch 6 Table 6.2). Choose its state.`,
      };
    }
    return {
      state: { landUse: 'grassland', management: 'nominal', input: 'medium' },
      note:
        `Recorded as ${use}${mg ? ` (${mg})` : ''}: taken as nominally managed, non-degraded grassland (IPCC ` +
        `2006 Vol 4 Ch 6 Table 6.2), as the record names no improvement or degradation.`,
    };
  }
  if (use === 'arable') {
    return {
      state: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
      note:
        'Recorded as arable: taken as long-term cultivated cropland, full tillage, medium input (IPCC 2006 Vol ' +
        '4 Ch 5 Table 5.5 defaults), as the record names no other tillage or input.',
    };
  }
  if (!use) return { state: null, note: 'The register has no land use for this parcel. Choose its current state.' };
  return {
    state: null,
    note: `Recorded as ${use}, which the grassland and cropland factors do not cover. Choose the state to estimate from.`,
  };
}

export function describeState(s: LandUseState): string {
  if (s.landUse === 'grassland')
    return `grassland, ${s.management.replace(/-/g, ' ')}${s.management === 'improved' ? `, ${s.input} input` : ''}`;
  return `cropland, ${s.system.replace(/-/g, ' ')}, ${s.tillage === 'none' ? 'no tillage' : `${s.tillage} tillage`}, ${s.input.replace(/-/g, ' ')} input`;
}
