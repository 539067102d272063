/**
 * What the factor-set pages say about each shipped table, in the users' terms: what the values
 * are, how the uncertainty is expressed, what an edition kept from the one before. The shipped
 * data files also carry the developers' notes on how each value was transcribed; those stay in
 * the data, the tests and the commit history, and are never shown (pure data).
 */
const G2006 = '2006 IPCC Guidelines for National Greenhouse Gas Inventories';
const R2019 = '2019 Refinement to the 2006 IPCC Guidelines for National Greenhouse Gas Inventories';
const AR = 'IPCC Assessment Reports AR4, AR5, AR6, Working Group I';
const GWP =
  'Global warming potentials of the IPCC assessment reports (AR4, AR5 without climate-carbon feedback, AR6 with ' +
  'the non-fossil methane value). Not part of the Guidelines; the same values are used in every factor set.';

const ERR_95 = 'The uncertainty is read as a 95 % interval (the table does not state its basis).';

const TABLES: Record<string, Record<string, string>> = {
  [G2006]: {
    'soc-ref':
      'Reference soil organic carbon stocks of mineral soils, 0-30 cm, under native vegetation. Errors are two ' +
      'standard deviations as a percentage of the mean. The table’s “cold temperate” zone is the “cool ' +
      'temperate” zone of the Chapter 3 climate scheme. The tropical montane row should be checked against the published table with particular care.',
    'cropland-stock-factors':
      'Stock change factors for cropland (land use, tillage, input). Errors are two standard deviations as a ' +
      'percentage of the mean. For paddy rice the tillage and input factors do not apply.',
    'grassland-stock-factors':
      `Stock change factors for grassland (land use, management, input). Temperate/boreal ` +
      `and tropical values have no moisture split. The input factor applies to improved grassland only. ${ERR_95}`,
    'grassland-biomass':
      `Non-woody biomass of grassland, above and below ground together, in tonnes of dry matter ` +
      `per hectare. Error ±75 % for every cell. ${ERR_95}`,
    'carbon-fraction':
      'Carbon fraction of dry matter. The table gives no uncertainty, so the value is held fixed in the range calculation.',
    'cropland-biomass':
      `Biomass carbon of cropland in tonnes of carbon per hectare (no carbon fraction to apply). ` +
      `Perennial values count above-ground biomass only. ${ERR_95}`,
    'organic-soil-ef':
      `Annual carbon loss from drained organic soils. Rows: boreal/cool temperate, warm temperate,` +
      ` tropical/sub-tropical. Error ±90 %. ${ERR_95}`,
    'n2o-mineralisation':
      'Carbon-to-nitrogen ratios of soil organic matter, the direct emission factor EF1, the leached fraction and ' +
      'the leaching emission factor EF5, used for N2O from mineralised soil nitrogen. Ranges are read as 95 % intervals.',
    gwp: GWP,
  },
  [AR]: { gwp: GWP },
  [R2019]: {
    'soc-ref':
      'Reference soil organic carbon stocks of mineral soils, 0-30 cm, as revised in 2019 from a larger ' +
      'compilation of soil profiles. Where the 2019 table gives no error, the 2006 error (±90 %) is used and marked with an asterisk.',
    'cropland-stock-factors':
      'Stock change factors for cropland as revised in 2019. The input and set-aside factors are unchanged from ' +
      '2006. Where the 2019 table gives no error, the 2006 error is used and marked with an asterisk.',
    'grassland-stock-factors':
      `Stock change factors for grassland. This set keeps the 2006 values of Table 6.2. ` +
      `The input factor applies to improved grassland only. ${ERR_95}`,
    'grassland-biomass':
      `Non-woody biomass of grassland, above and below ground together, in tonnes of dry matter ` +
      `per hectare. This set keeps the 2006 values of Table 6.4. Error ±75 % for every cell. ${ERR_95}`,
    'carbon-fraction':
      'Carbon fraction of dry matter. This set keeps the 2006 value. No uncertainty is given, so the value is held fixed in the range calculation.',
    'cropland-biomass':
      `Biomass carbon of cropland in tonnes of carbon per hectare. This set keeps the 2006 ` +
      `values of Table 5.9. Perennial values count above-ground biomass only. ${ERR_95}`,
    'organic-soil-ef':
      `Annual carbon loss from drained organic soils. The 2019 Refinement refers organic soils to ` +
      `the 2013 Wetlands Supplement (Chapter 2, Table 2.1), which splits drained grassland by nutrient status and ` +
      `drainage depth; an estimate does not carry those, so this set keeps the 2006 values. Error ±90 %. ${ERR_95}`,
    'n2o-mineralisation':
      'Carbon-to-nitrogen ratios, the direct emission factor EF1 (disaggregated in 2019), the leached fraction and ' +
      'EF5, used for N2O from mineralised soil nitrogen. Ranges are read as 95 % intervals.',
    gwp: GWP,
  },
};

const ENTRIES: Record<string, Record<string, string>> = {
  [G2006]: Object.fromEntries(
    ['hac', 'lac', 'sandy', 'volcanic', 'wetland', 'spodic'].map((s) => [
      `soc-ref/tropical-montane/${s}`,
      'Tropical montane row: check against the published table before relying on it.',
    ]),
  ),
  [R2019]: {
    'n2o-mineralisation/cn-ratio/land-use-change': 'Land-use change from forest land or grassland to cropland.',
    'n2o-mineralisation/cn-ratio/cropland-management': 'Management change on cropland remaining cropland.',
  },
};

/** Words that mark a developer's note, never shown on a page. */
const DEVELOPER_NOTE =
  /memory|recall|ipcc-tier1|\.md\b|the reference (is|believes|gives|recalls)|page[s]? not recorded/i;

/** The remark shown for a table: ours for shipped tables, else the set's own note unless it is a developer's note. */
export function tableRemark(sourceDocument: string, tableKey: string, note: string | undefined | null): string | null {
  return TABLES[sourceDocument]?.[tableKey] ?? (note && !DEVELOPER_NOTE.test(note) ? note : null);
}

/** The remark shown for a value (entry keys as in the set, e.g. "n2o-mineralisation/cn-ratio/land-use-change"). */
export function entryRemark(
  sourceDocument: string,
  tableKey: string,
  entryKey: string,
  note: string | undefined | null,
): string | null {
  return ENTRIES[sourceDocument]?.[`${tableKey}/${entryKey}`] ?? (note && !DEVELOPER_NOTE.test(note) ? note : null);
}

/** A set's description as shown: the set's own, unless it is a developer's note (as the shipped sets' are). */
export function setDescription(title: string, description: string): string {
  return DEVELOPER_NOTE.test(description) || /\.md\b|team reference/i.test(description)
    ? `${title}. The values are transcribed from the published IPCC tables; each table below says where it comes ` +
        `from and whether this authority has checked it against the published document.`
    : description;
}
