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
export type Pattern = 'solid' | 'hatch' | 'cross' | 'dots' | 'vertical' | 'horizontal' | 'backslash';

export interface LegendEntry {
  label: string;
  colour: string;
  pattern: Pattern;
}

const OKABE_ITO = ['#0072B2', '#E69F00', '#009E73', '#CC79A7', '#56B4E9', '#D55E00', '#F0E442', '#000000'];
const PATTERNS: Pattern[] = ['hatch', 'dots', 'cross', 'vertical', 'horizontal', 'backslash', 'solid'];

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
 * Legend entries for a kind's classes, stable by class order: the i-th class gets the i-th
 * colour and pattern, so two classes differ in both (7 patterns x 8 colours).
 */
export function legendFor(kind: ReferenceKind, classes: readonly string[]): Record<string, LegendEntry> {
  const ordered = KIND_INFO[kind].classes ? KIND_INFO[kind].classes!.filter((c) => classes.includes(c)) : [...classes].sort();
  const offset = REFERENCE_KINDS.indexOf(kind) * 2;
  return Object.fromEntries(
    ordered.map((cls, i) => [cls, { label: classLabel(cls), colour: OKABE_ITO[(i + offset) % OKABE_ITO.length]!, pattern: PATTERNS[i % PATTERNS.length]! }]),
  );
}

/** Checks a class value for a kind; returns a message when it is not allowed. */
export function classProblem(kind: ReferenceKind, value: unknown): string | null {
  const cls = typeof value === 'string' ? value.trim() : typeof value === 'number' ? String(value) : '';
  if (!cls) return 'The class attribute is empty.';
  const allowed = KIND_INFO[kind].classes;
  if (allowed && !allowed.includes(cls)) return `Class "${cls}" is not one of ${allowed.join(', ')}.`;
  return null;
}
