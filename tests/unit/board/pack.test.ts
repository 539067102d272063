/** The board pack's clock, impact words and PDF text (pure). */
import { describe, expect, it } from 'vitest';
import { budgetText, clockText } from '~/lib/board/pack-words';
import { pdfText } from '~/lib/pdf/document';
import { clockOf } from '~/lib/board/clock';

describe('statutory clock of an item', () => {
  // Whole calendar days to the deadline; "near" within the authority's reminder days, the last day included (common practice).
  const due = '2027-01-06';
  it('is overdue the day after the deadline, near within the reminder days, running before', () => {
    expect(clockOf(due, 'on-agenda', 7, '2027-01-07')).toEqual({ decisionDue: due, daysLeft: -1, state: 'overdue' });
    expect(clockOf(due, 'on-agenda', 7, '2027-01-06')).toEqual({ decisionDue: due, daysLeft: 0, state: 'near' });
    expect(clockOf(due, 'on-agenda', 7, '2026-12-30')).toEqual({ decisionDue: due, daysLeft: 7, state: 'near' });
    expect(clockOf(due, 'on-agenda', 7, '2026-12-29')).toEqual({ decisionDue: due, daysLeft: 8, state: 'running' });
  });
  it('stops once decided, and says overdue in words', () => {
    expect(clockOf(due, 'decided', 7, '2027-02-01').state).toBe('stopped');
    expect(clockOf(null, 'assessed', 7, '2027-02-01').state).toBe('stopped');
    expect(clockText(clockOf(due, 'on-agenda', 7, '2027-01-09'))).toBe(
      'Overdue by 3 days: the decision was due 6 Jan 2027',
    );
    expect(clockText(clockOf(due, 'on-agenda', 7, '2027-01-01'))).toBe(
      'Deadline near: 5 days left (decision due 6 Jan 2027)',
    );
  });
});

describe('budget preview', () => {
  it('adds the proposal to what current approvals commit and says when the budget is passed', () => {
    // 4,900 + 123.2 = 5,023.2 t of a 5,000 t budget: 100.5 % (arithmetic).
    const text = budgetText({
      year: 2027,
      budgetT: 5000,
      committedT: 4900,
      proposalT: 123.2,
      afterT: 5023.2,
      shareAfter: 5023.2 / 5000,
      overBudget: true,
    });
    expect(text).toContain('5,023.2 t CO2e, 100.5 % of the budget — OVER the budget');
    expect(
      budgetText({
        year: 2027,
        budgetT: null,
        committedT: 0,
        proposalT: 10,
        afterT: 10,
        shareAfter: null,
        overBudget: null,
      }),
    ).toMatch(/no yearly budget/);
  });
});

describe('text for the PDF font (Latin subset)', () => {
  it('keeps Latin-1 and typographic punctuation, drops accents it lacks (Unicode NFKD, UAX #15) and marks the rest', () => {
    expect(pdfText('Café — “quoted” 95 % ±90%')).toBe('Café — “quoted” 95 % ±90%');
    expect(pdfText('Łąka ≥ 5 ha → CO₂')).toBe('?aka >= 5 ha -> CO2');
    expect(pdfText('草地')).toBe('??');
  });
});
