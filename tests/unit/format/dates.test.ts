import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime, todayIso } from '~/lib/format/dates';

// Expected texts follow the CLDR en-GB patterns (day, abbreviated month, year; 24-hour clock),
// the data Intl.DateTimeFormat uses; UTC offsets per ISO 8601.
describe('formatDate', () => {
  it('writes a calendar day as that day, whatever the time zone of the process', () => {
    expect(formatDate('2026-12-02')).toBe('2 Dec 2026');
    expect(formatDate('2026-01-31')).toBe('31 Jan 2026');
  });
  it('writes an instant as its UTC day', () => {
    // 23:30 at UTC-05:00 is 04:30 the next day in UTC (ISO 8601 offsets).
    expect(formatDate('2026-03-14T23:30:00-05:00')).toBe('15 Mar 2026');
    expect(formatDate(new Date(Date.UTC(2025, 6, 4, 12)))).toBe('4 Jul 2025');
  });
  it('gives the dash, or the text asked for, for nothing or garbage', () => {
    expect(formatDate(null)).toBe('—');
    expect(formatDate(undefined, 'never')).toBe('never');
    expect(formatDate('not a date')).toBe('—');
    expect(formatDate('2026-13-45')).toBe('—');
  });
});

describe('formatDateTime', () => {
  it('writes day, 24-hour time and the zone', () => {
    expect(formatDateTime('2026-12-02T14:05:59Z')).toBe('2 Dec 2026, 14:05 UTC');
    expect(formatDateTime('2026-06-30T00:07:00+02:00')).toBe('29 Jun 2026, 22:07 UTC');
    expect(formatDateTime(Date.UTC(2026, 0, 1, 0, 0))).toBe('1 Jan 2026, 00:00 UTC');
  });
  it('gives the dash for nothing', () => {
    expect(formatDateTime(null)).toBe('—');
  });
});

describe('todayIso', () => {
  it('is the UTC calendar day', () => {
    expect(todayIso(new Date('2026-12-31T23:59:59-01:00'))).toBe('2027-01-01');
  });
});
