/**
 * The alternatives an assessor weighs against a proposal (pure): each is a set of areas with a
 * before and after state, estimated in full like the proposal itself.
 */
import type { LandUseState } from '../carbon';

export const ALTERNATIVE_KEYS = [
  'baseline',
  'proposal',
  'reduced-tillage',
  'no-tillage',
  'higher-input',
  'share',
  'compensation',
] as const;
export type AlternativeKey = (typeof ALTERNATIVE_KEYS)[number];

export type AlternativeSpec = {
  key: AlternativeKey;
  label: string;
  description: string;
  /** The after state replacing the proposal's, or null to keep the proposal's. */
  after: ((proposed: LandUseState, before: LandUseState) => LandUseState) | null;
  /** Share of each area converted (1 = all). */
  areaShare: number;
};

export function alternativeSpecs(
  proposed: LandUseState,
  sharePercent: number,
): { spec: AlternativeSpec; unavailable: string | null }[] {
  const crop = proposed.landUse === 'cropland' ? proposed : null;
  const tillage = (t: 'reduced' | 'none') => (p: LandUseState) => (p.landUse === 'cropland' ? { ...p, tillage: t } : p);
  const notCrop = crop ? null : 'The proposal does not turn the land into cropland, so tillage does not apply.';
  return [
    {
      spec: {
        key: 'baseline',
        label: 'Keep as it is',
        description: 'No change: the parcels stay in their current use and management.',
        after: (_p, b) => b,
        areaShare: 1,
      },
      unavailable: null,
    },
    {
      spec: {
        key: 'proposal',
        label: 'The proposal',
        description: 'The change as proposed, on the whole area.',
        after: null,
        areaShare: 1,
      },
      unavailable: null,
    },
    {
      spec: {
        key: 'reduced-tillage',
        label: 'Reduced tillage',
        description: 'The proposed cropping with reduced tillage instead.',
        after: tillage('reduced'),
        areaShare: 1,
      },
      unavailable: crop?.tillage === 'reduced' ? 'The proposal already uses reduced tillage.' : notCrop,
    },
    {
      spec: {
        key: 'no-tillage',
        label: 'No tillage',
        description: 'The proposed cropping without tillage (direct drilling).',
        after: tillage('none'),
        areaShare: 1,
      },
      unavailable: crop?.tillage === 'none' ? 'The proposal already uses no tillage.' : notCrop,
    },
    {
      spec: {
        key: 'higher-input',
        label: 'Higher input',
        description: crop ? 'The proposed cropping with high input and manure.' : 'Improved grassland with high input.',
        after: (p) =>
          p.landUse === 'cropland'
            ? { ...p, input: 'high-with-manure' }
            : { landUse: 'grassland', management: 'improved', input: 'high' },
        areaShare: 1,
      },
      unavailable: crop?.input === 'high-with-manure' ? 'The proposal already uses the highest input.' : null,
    },
    {
      spec: {
        key: 'share',
        label: `Convert ${sharePercent} % only`,
        description: `The change on ${sharePercent} % of the area; the rest kept as it is.`,
        after: null,
        areaShare: sharePercent / 100,
      },
      unavailable: null,
    },
  ];
}

/** Restoring a parcel to grassland as compensation: nominally managed, medium input. */
export const RESTORED_STATE: LandUseState = { landUse: 'grassland', management: 'nominal', input: 'medium' };
