/**
 * A region's agricultural area and permanent grassland as of a date, from its parcels' land-use
 * histories (pure). Permanent grassland uses the same flags as the parcel panel
 * (land-use-history.ts, windows from the GIS settings). Agricultural area: parcels whose land use
 * on that date is a grassland use or cropland (arable, fallow). A grassland parcel whose history
 * is too short to call it permanent, or a parcel with no land use on that date, is counted
 * apart (undecided / unknown), never guessed.
 */
import { DEFAULT_GRASSLAND_USES, deriveLandUseFlags, type LandUseEvent } from './land-use-history';

export const CROPLAND_USES = ['arable', 'fallow'];

export type LandUseWindows = {
  permanentGrasslandYears: number;
  uncultivatedYears: number;
  tillageEndsGrassland: boolean;
};
export type RegionParcel = { regionKey: string; areaHa: number; events: LandUseEvent[] };

export interface RegionFigures {
  key: string;
  label: string;
  parcels: number;
  agriculturalHa: number;
  permanentGrasslandHa: number;
  /** Grassland whose permanence the history cannot decide (too short). */
  undecidedHa: number;
  /** Parcels with no land use recorded on or before the date. */
  unknownUseHa: number;
}

export function regionFigures(
  regions: { key: string; label: string }[],
  parcels: RegionParcel[],
  asOf: string,
  windows: LandUseWindows,
): RegionFigures[] {
  const out = new Map(
    regions.map((r) => [
      r.key,
      {
        key: r.key,
        label: r.label,
        parcels: 0,
        agriculturalHa: 0,
        permanentGrasslandHa: 0,
        undecidedHa: 0,
        unknownUseHa: 0,
      },
    ]),
  );
  const grass = new Set(DEFAULT_GRASSLAND_USES);
  for (const p of parcels) {
    const fig = out.get(p.regionKey);
    if (!fig) continue;
    fig.parcels += 1;
    const flags = deriveLandUseFlags(p.events, { asOf, ...windows });
    const use = flags.currentLandUse;
    if (use === null) {
      fig.unknownUseHa += p.areaHa;
      continue;
    }
    if (!grass.has(use) && !CROPLAND_USES.includes(use)) continue;
    fig.agriculturalHa += p.areaHa;
    if (flags.permanentGrassland.value === true) fig.permanentGrasslandHa += p.areaHa;
    else if (flags.permanentGrassland.value === null) fig.undecidedHa += p.areaHa;
  }
  return [...out.values()];
}

/** The history decides the ratio on that date: every parcel's use is known and every grassland decided. */
export function historyCovers(f: RegionFigures): boolean {
  return f.agriculturalHa > 0 && f.undecidedHa === 0 && f.unknownUseHa === 0;
}
