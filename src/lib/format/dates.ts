/**
 * The one way Swardkeep writes dates and times: pages, islands, PDFs, e-mails and the mail box.
 * Policy: British English day, short month, year ("2 Dec 2026"); times on the 24-hour clock in
 * Coordinated Universal Time, always marked "UTC" ("2 Dec 2026, 14:05 UTC"). Server and browser
 * give the same text whatever their own locale or zone. Calendar dates stored as "YYYY-MM-DD"
 * (due dates, meeting dates) are days, not instants: they are written as that day, never shifted.
 * Pure: no I/O.
 */
export const DATE_LOCALE = 'en-GB';
export const DATE_TIME_ZONE = 'UTC';

const DAY = new Intl.DateTimeFormat(DATE_LOCALE, {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: DATE_TIME_ZONE,
});
const TIME = new Intl.DateTimeFormat(DATE_LOCALE, {
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
  timeZone: DATE_TIME_ZONE,
});
const CALENDAR_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

export type DateInput = string | number | Date | null | undefined;

function toDate(v: DateInput): Date | null {
  if (v === null || v === undefined || v === '') return null;
  if (v instanceof Date) return Number.isNaN(v.getTime()) ? null : v;
  if (typeof v === 'string') {
    const m = CALENDAR_DAY.exec(v);
    const d = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : new Date(v);
    if (Number.isNaN(d.getTime())) return null;
    return m && d.toISOString().slice(0, 10) !== v ? null : d; // 2026-02-30 is no day
  }
  const d = new Date(v);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** Calendar days already written: the same day always gives the same text (a large proposal writes thousands). */
const dayTexts = new Map<string, string>();
const DAY_TEXTS_MAX = 5000;

/** "2 Dec 2026"; `empty` (default "—") for a missing or unreadable value. */
export function formatDate(v: DateInput, empty = '—'): string {
  const known = typeof v === 'string' ? dayTexts.get(v) : undefined;
  if (known !== undefined) return known;
  const d = toDate(v);
  if (!d) return empty;
  const text = DAY.format(d);
  if (typeof v === 'string' && CALENDAR_DAY.test(v) && dayTexts.size < DAY_TEXTS_MAX) dayTexts.set(v, text);
  return text;
}

/** "2 Dec 2026, 14:05 UTC"; `empty` (default "—") for a missing or unreadable value. */
export function formatDateTime(v: DateInput, empty = '—'): string {
  const d = toDate(v);
  return d ? `${DAY.format(d)}, ${TIME.format(d)} UTC` : empty;
}

/** Today as a calendar day "YYYY-MM-DD" in the policy's zone (for date inputs and comparisons). */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}
