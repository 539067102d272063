/**
 * A factor's key in words, for every screen that lists factor values. Keys stay as stored
 * ("soc-ref/cold-temperate-moist/hac"); screens show one name per thing. The climate zone the
 * 2006 Guidelines' Table 2.3 call "cold temperate" is the "cool temperate" zone of their
 * Chapter 3 scheme, the name the 2019 Refinement uses too, so it is written "cool temperate"
 * everywhere (pure).
 */
const WORDS: Record<string, string> = {
  'soc-ref': 'Reference soil carbon',
  'cropland-stock-factors': 'Cropland stock change factor',
  'grassland-stock-factors': 'Grassland stock change factor',
  'grassland-biomass': 'Grassland biomass',
  'carbon-fraction': 'Carbon fraction',
  'cropland-biomass': 'Cropland biomass',
  'organic-soil-ef': 'Organic soil emission factor',
  'n2o-mineralisation': 'N2O from mineralisation',
  gwp: 'Global warming potential',
  constant: 'Constant',
  'c-to-co2': 'carbon to CO2 (44/12)',
  'n2o-n-to-n2o': 'N2O-N to N2O (44/28)',
  'cold-temperate-dry': 'cool temperate dry',
  'cold-temperate-moist': 'cool temperate moist',
  'cold-temperate-wet': 'cool temperate wet',
  'boreal-cold-temperate': 'boreal and cool temperate',
  'temperate-boreal-dry': 'temperate and boreal, dry',
  'temperate-boreal-moist': 'temperate and boreal, moist',
  'tropical-moist-wet': 'tropical moist and wet',
  hac: 'high-activity clay',
  lac: 'low-activity clay',
  wetland: 'wetland (mineral)',
  'f-lu': 'land use (F_LU)',
  'f-mg': 'management (F_MG)',
  'f-i': 'input (F_I)',
  'all-permanent': 'all permanent grassland',
  'long-term-cultivated': 'long-term cultivated',
  'set-aside': 'set-aside',
  'paddy-rice': 'paddy rice',
  'high-with-manure': 'high, with manure',
  'high-without-manure': 'high, without manure',
  'moderately-degraded': 'moderately degraded',
  'severely-degraded': 'severely degraded',
  'above-ground': 'above ground',
  total: 'above and below ground',
  'cn-ratio': 'C:N ratio',
  'land-use-change': 'land-use change',
  'cropland-management': 'cropland management',
  ef1: 'EF1',
  ef5: 'EF5',
  'frac-leach': 'leached fraction (Frac_LEACH)',
  'flooded-rice': 'flooded rice',
  ar4: 'AR4',
  ar5: 'AR5',
  ar6: 'AR6',
  ch4: 'CH4',
  n2o: 'N2O',
  'ch4-fossil': 'CH4 (fossil)',
  'ch4-non-fossil': 'CH4 (non-fossil)',
  all: 'all',
};

/** One part of a key in words: the list above, else the part with hyphens as spaces. */
export function keyPartWords(part: string): string {
  return WORDS[part] ?? part.replace(/-/g, ' ');
}

/** "cold-temperate-moist/hac" → "cool temperate moist · high-activity clay". */
export function entryWords(entryKey: string): string {
  return entryKey.split('/').map(keyPartWords).join(' · ');
}

/** A used factor's full key ("soc-ref/cold-temperate-moist/hac") → "Reference soil carbon: cool temperate moist · high-activity clay". */
export function factorKeyWords(key: string): string {
  const [table, ...rest] = key.split('/');
  return rest.length ? `${keyPartWords(table!)}: ${entryWords(rest.join('/'))}` : keyPartWords(table!);
}
