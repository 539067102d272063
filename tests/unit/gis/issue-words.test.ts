/** Problem kinds in words with English plural forms (CLDR rules through Intl.PluralRules: "one" only for 1). */
import { describe, expect, it } from 'vitest';
import { countOf, issueCountText } from '../../../src/lib/gis/issue-words';

describe('issue words', () => {
  it('chooses the singular for 1 and the plural otherwise (CLDR English plural rules)', () => {
    expect(issueCountText('self-intersection', 1)).toBe('1 boundary that crosses itself');
    expect(issueCountText('self-intersection', 3)).toBe('3 boundaries that cross themselves');
    expect(issueCountText('reference-in-register', 0)).toBe('0 references already in the register');
    expect(issueCountText('reference-in-register', 1286)).toBe('1,286 references already in the register');
    expect(countOf(1, 'rejected one was', 'rejected ones were')).toBe('1 rejected one was');
    expect(countOf(2, 'parcel', 'parcels')).toBe('2 parcels');
  });
  it('shows an unknown code as words rather than failing', () => {
    expect(issueCountText('some-new-check', 2)).toBe('some new check: 2');
  });
});
