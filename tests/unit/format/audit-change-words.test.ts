import { describe, expect, it } from 'vitest';
import { changeLines, fieldWords, valueWords } from '~/lib/audit/change-words';

// The "field: before → after" reading of a change record is common practice for audit trails.
describe('audit change words', () => {
  it('pairs before and after per field', () => {
    expect(
      changeLines({
        before: { roles: ['planner'], status: 'active' },
        after: { roles: ['planner', 'assessor'], status: 'active' },
      }),
    ).toEqual([
      { field: 'Roles', before: 'planner', after: 'planner, assessor' },
      { field: 'Status', before: 'active', after: 'active' },
    ]);
  });
  it('reads the older { before, patch } shape, marking fields the patch left alone', () => {
    expect(changeLines({ before: { roles: ['admin'], status: 'active' }, patch: { active: false } })).toEqual([
      { field: 'Active', before: '—', after: 'no' },
      { field: 'Roles', before: 'admin', after: '(unchanged)' },
      { field: 'Status', before: 'active', after: '(unchanged)' },
    ]);
  });
  it('lists other details as field: value', () => {
    expect(changeLines({ reason: 'typo', rows: 3, bbox: { minX: 1, maxX: 2 }, ok: true })).toEqual([
      { field: 'Reason', after: 'typo' },
      { field: 'Rows', after: '3' },
      { field: 'Bbox', after: 'min x: 1; max x: 2' },
      { field: 'Ok', after: 'yes' },
    ]);
    expect(changeLines({})).toEqual([]);
    expect(changeLines(null)).toEqual([]);
  });
  it('writes field names and empty values in words', () => {
    expect(fieldWords('entityId')).toBe('Entity id');
    expect(fieldWords('grass_since')).toBe('Grass since');
    expect(valueWords([])).toBe('none');
    expect(valueWords(null)).toBe('—');
    expect(valueWords([{ a: 1 }])).toBe('(a: 1)');
  });
});
