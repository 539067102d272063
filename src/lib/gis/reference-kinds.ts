/**
 * The kinds of reference layer, their allowed classes and their legend (pure: islands import it).
 * Class keys for climate and soil are the IPCC ones the carbon engine reads (2006 Guidelines
 * Vol 4 Ch 3 Annex 3A.5); the other kinds take whatever classes the authority's data has.
 * Colours are our own, chosen from the Okabe-Ito colour-blind-safe set (common practice) and
 * every class also has a pattern and a name, so nothing depends on colour alone.
 */
import { CLIMATE_REGIONS, SOIL_TYPES } from '../carbon/types';

export const REFERENCE_KINDS = ['climate', 'soil', 'sensitive', 'slope', 'never-tilled', 'region'] as const;
export type ReferenceKind = (typeof REFERENCE_KINDS)[number];

/** How a parcel's overlay with a kind is summarised (see overlay-summary.ts). */
export type OverlayRule = 'largest-share' | 'fractions' | 'shares';

export interface KindInfo {
  label: string;
  rule: OverlayRule;
  /** Allowed class keys, or null when any non-empty class is accepted. */
  classes: readonly string[] | null;
  /** A parcel not fully inside the layer is flagged (climate and soil: the estimate needs them). */
  flagUncovered: boolean;
}

export const KIND_INFO: Record<ReferenceKind, KindInfo> = {
  climate: { label: 'IPCC climate regions', rule: 'largest-share', classes: CLIMATE_REGIONS, flagUncovered: true },
  soil: { label: 'Soil units (IPCC soil class)', rule: 'fractions', classes: SOIL_TYPES, flagUncovered: true },
  sensitive: { label: 'Designated sensitive grassland', rule: 'shares', classes: null, flagUncovered: false },
  slope: { label: 'Slope and erosion classes', rule: 'shares', classes: null, flagUncovered: false },
  'never-tilled': { label: 'Never-tilled grassland', rule: 'shares', classes: null, flagUncovered: false },
  /** Accounting regions for the permanent-grassland ratio; a parcel belongs to the one with its largest share. */
  region: { label: 'Accounting regions (districts)', rule: 'largest-share', classes: null, flagUncovered: false },
};

/** Fill patterns drawn by the map legend and layer styles. */
export type Pattern =
  'solid' | 'hatch' | 'cross' | 'dots' | 'vertical' | 'horizontal' | 'backslash' | 'grid' | 'rings' | 'checker';

export interface LegendEntry {
  label: string;
  colour: string;
  pattern: Pattern;
}

/**
 * Seven hues of the Okabe-Ito colour-blind-safe set (common practice), in our own order: dark and
 * light alternate, and the pale yellow is left out (it vanishes on the paper background).
 */
const COLOURS = ['#0072B2', '#E69F00', '#000000', '#CC79A7', '#009E73', '#D55E00', '#56B4E9'];
/** Ten patterns; with seven colours (coprime), the first 70 classes on the map each get their own pair. */
const PATTERNS: Pattern[] = [
  'hatch',
  'dots',
  'grid',
  'backslash',
  'rings',
  'horizontal',
  'cross',
  'checker',
  'vertical',
  'solid',
];

const CLASS_LABELS: Record<string, string> = {
  hac: 'High-activity clay (HAC)',
  lac: 'Low-activity clay (LAC)',
  sandy: 'Sandy',
  spodic: 'Spodic',
  volcanic: 'Volcanic',
  wetland: 'Wetland',
  organic: 'Organic (peat)',
};

/** "cool-temperate-moist" → "Cool temperate moist"; known soil keys get their IPCC names. */
export function classLabel(cls: string): string {
  if (CLASS_LABELS[cls]) return CLASS_LABELS[cls];
  const words = cls.replace(/[-_]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/**
 * Legend entries for a kind's classes, stable by class order. `start` is the number of classes
 * of the layers before this one on the map (`legendForAll`), so every class on the map, whatever
 * its layer, gets its own colour and pattern, and neighbours in the legend differ in both.
 */
export function legendFor(kind: ReferenceKind, classes: readonly string[], start = 0): Record<string, LegendEntry> {
  return Object.fromEntries(
    orderedClasses(kind, classes).map((cls, i) => [
      cls,
      {
        label: classLabel(cls),
        colour: COLOURS[(start + i) % COLOURS.length]!,
        pattern: PATTERNS[(start + i) % PATTERNS.length]!,
      },
    ]),
  );
}

function orderedClasses(kind: ReferenceKind, classes: readonly string[]): string[] {
  return KIND_INFO[kind].classes ? KIND_INFO[kind].classes!.filter((c) => classes.includes(c)) : [...classes].sort();
}

/** Legends of the current layers, numbered across layers in the order of REFERENCE_KINDS. */
export function legendForAll(
  layers: { kind: ReferenceKind; classes: readonly string[] }[],
): Map<ReferenceKind, Record<string, LegendEntry>> {
  const out = new Map<ReferenceKind, Record<string, LegendEntry>>();
  let start = 0;
  for (const kind of REFERENCE_KINDS) {
    const layer = layers.find((l) => l.kind === kind);
    if (!layer) continue;
    out.set(kind, legendFor(kind, layer.classes, start));
    start += orderedClasses(kind, layer.classes).length;
  }
  return out;
}

/** Checks a class value for a kind; returns a message when it is not allowed. */
export function classProblem(kind: ReferenceKind, value: unknown): string | null {
  const cls = typeof value === 'string' ? value.trim() : typeof value === 'number' ? String(value) : '';
  if (!cls) return 'The class attribute is empty.';
  const allowed = KIND_INFO[kind].classes;
  if (allowed && !allowed.includes(cls)) return `Class "${cls}" is not one of ${allowed.join(', ')}.`;
  return null;
}
