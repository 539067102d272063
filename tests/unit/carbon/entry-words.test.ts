import { describe, expect, it } from 'vitest';
import { entryWords, factorKeyWords } from '~/lib/carbon/entry-words';
import { CLIMATE_LABELS } from '~/components/calculator/labels';
import ipcc2006 from '~/lib/carbon/factor-sets/ipcc-2006.json';
import ipcc2019 from '~/lib/carbon/factor-sets/ipcc-2019.json';

// 2006 IPCC Guidelines, Vol 4, Ch 3, Annex 3A.5 (climate scheme) names the zone "cool temperate";
// Vol 4, Ch 2, Table 2.3 heads the same zone "cold temperate". The 2019 Refinement keeps "cool temperate".
describe('factor keys in words', () => {
  it('write the cold-temperate keys as the cool temperate zone, as the climate menu does', () => {
    expect(entryWords('cold-temperate-moist/hac')).toBe('cool temperate moist · high-activity clay');
    expect(
      entryWords('cold-temperate-moist/hac').startsWith(CLIMATE_LABELS['cool-temperate-moist'].toLowerCase()),
    ).toBe(true);
    expect(factorKeyWords('organic-soil-ef/grassland/boreal-cold-temperate')).toBe(
      'Organic soil emission factor: grassland · boreal and cool temperate',
    );
    expect(factorKeyWords('grassland-stock-factors/f-mg/improved/temperate-boreal-moist')).toBe(
      'Grassland stock change factor: management (F_MG) · improved · temperate and boreal, moist',
    );
  });

  it('never show "cold temperate" for any shipped entry', () => {
    for (const set of [ipcc2006, ipcc2019]) {
      for (const t of set.tables)
        for (const e of t.entries) expect(factorKeyWords(`${t.key}/${e.key}`)).not.toMatch(/cold/i);
    }
  });
});
