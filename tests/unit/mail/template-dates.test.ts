import { describe, expect, it } from 'vitest';
import { boardDecisionMail, proposalSubmittedMail } from '~/lib/mail/templates';

// Mails write dates as the pages do: CLDR en-GB day, short month, year (lib/format/dates).
describe('mail dates', () => {
  const ref = { reference: 'P-2026-0099', title: 'Lower field', url: 'http://127.0.0.1/proposals/99' };
  it('writes due dates in the one format', () => {
    const m = proposalSubmittedMail({ ...ref, name: 'Tomas', by: 'Ada', decisionDue: '2027-01-15' });
    expect(m.text).toContain('The decision is due by 15 Jan 2027.');
    expect(m.text).not.toMatch(/\d{4}-\d{2}-\d{2}/);
  });
  it('writes effective, appeal and condition dates in the one format', () => {
    const m = boardDecisionMail({
      ...ref,
      name: 'Tomas',
      outcome: 'approved-with-conditions',
      reasons: 'Fine.',
      conditions: [{ text: 'Hedge kept.', dueDate: '2027-03-01', checkedBy: 'Office' }],
      appealUntil: '2027-02-12',
      effectiveDate: '2027-01-15',
      registerSeq: 3,
    });
    expect(m.text).toContain('(due 1 Mar 2027; checked by Office)');
    expect(m.text).toContain('Effective from 15 Jan 2027. An appeal may be lodged until 12 Feb 2027;');
  });
});
