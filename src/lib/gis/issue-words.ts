/**
 * The validation report's problem kinds in words, with plural forms chosen by Intl.PluralRules
 * (pure: islands and the CSV export share it). A code without words here shows as itself with
 * its dashes turned into spaces, so a new check never breaks the report.
 */
const WORDS: Record<string, { one: string; other: string }> = {
  'antimeridian-split': { one: 'parcel split at the 180° meridian', other: 'parcels split at the 180° meridian' },
  'area-mismatch': {
    one: 'stated area differs from the measured one',
    other: 'stated areas differ from the measured ones',
  },
  'axes-swapped': {
    one: 'feature with latitude and longitude swapped',
    other: 'features with latitude and longitude swapped',
  },
  'bad-area': { one: 'unreadable stated area', other: 'unreadable stated areas' },
  'bad-class': { one: 'class not known to this layer', other: 'classes not known to this layer' },
  'bad-date': { one: 'unreadable date', other: 'unreadable dates' },
  'bad-reference': {
    one: 'reference with characters that are not allowed',
    other: 'references with characters that are not allowed',
  },
  'bad-shp': { one: 'unreadable shape', other: 'unreadable shapes' },
  'coordinates-out-of-range': {
    one: 'feature with coordinates off the globe',
    other: 'features with coordinates off the globe',
  },
  'duplicate-geometry': { one: 'boundary repeated in the file', other: 'boundaries repeated in the file' },
  'duplicate-reference': { one: 'reference repeated in the file', other: 'references repeated in the file' },
  'empty-geometry': { one: 'feature without a boundary', other: 'features without a boundary' },
  'history-contradiction': {
    one: 'land-use history that contradicts itself',
    other: 'land-use histories that contradict themselves',
  },
  'hole-outside': { one: 'hole outside its parcel', other: 'holes outside their parcels' },
  'near-duplicate': { one: 'near copy of another parcel', other: 'near copies of other parcels' },
  'no-reference': { one: 'feature without a reference', other: 'features without a reference' },
  'not-polygon': { one: 'feature that is not an area', other: 'features that are not areas' },
  'outside-crs-area': {
    one: 'feature outside the area of its coordinate system',
    other: 'features outside the area of their coordinate system',
  },
  'outside-territory': {
    one: 'feature outside the authority’s territory',
    other: 'features outside the authority’s territory',
  },
  overlap: { one: 'overlap with another parcel', other: 'overlaps with other parcels' },
  'overlap-minor': { one: 'small overlap along a shared edge', other: 'small overlaps along shared edges' },
  'repeated-vertex': { one: 'boundary with repeated points removed', other: 'boundaries with repeated points removed' },
  'ring-not-closed': { one: 'boundary that does not close', other: 'boundaries that do not close' },
  'ring-orientation': {
    one: 'boundary drawn the other way round (turned)',
    other: 'boundaries drawn the other way round (turned)',
  },
  'ring-too-short': { one: 'boundary with too few points', other: 'boundaries with too few points' },
  'self-intersection': { one: 'boundary that crosses itself', other: 'boundaries that cross themselves' },
  sliver: { one: 'sliver too small to be a parcel', other: 'slivers too small to be parcels' },
  'spike-removed': { one: 'spike removed from a boundary', other: 'spikes removed from boundaries' },
  'geometry-in-register': { one: 'boundary already in the register', other: 'boundaries already in the register' },
  'reference-in-register': { one: 'reference already in the register', other: 'references already in the register' },
};

const plural = new Intl.PluralRules('en-GB');

/** "3 boundaries that cross themselves", "1 reference already in the register". */
export function issueCountText(code: string, n: number): string {
  const w = WORDS[code];
  if (!w) return `${code.replace(/-/g, ' ')}: ${n}`;
  return `${n.toLocaleString('en-GB')} ${plural.select(n) === 'one' ? w.one : w.other}`;
}

/** A count and a noun with the right plural form: countOf(1, 'parcel', 'parcels') is "1 parcel". */
export function countOf(n: number, one: string, other: string): string {
  return `${n.toLocaleString('en-GB')} ${plural.select(n) === 'one' ? one : other}`;
}
