/** Mail texts (pure: data in, subject/text/html out). Plain words, no tracking, no images. */
export type MailContent = { subject: string; text: string; html: string };

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function render(subject: string, paragraphs: string[], link?: { url: string; label: string }): MailContent {
  const text = [...paragraphs, ...(link ? [`${link.label}: ${link.url}`] : []), '', '— Swardkeep'].join('\n\n');
  const html = [
    ...paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    ...(link ? [`<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>`] : []),
    '<p>— Swardkeep</p>',
  ].join('\n');
  return { subject, text, html };
}

export function invitationMail(p: { name: string; invitedBy: string; roles: string; url: string; expiresDays: number }): MailContent {
  return render(
    'Your Swardkeep account',
    [
      `Hello ${p.name},`,
      `${p.invitedBy} has opened a Swardkeep account for you (${p.roles}).`,
      `Choose your password with the link below. It works once and expires in ${p.expiresDays} days.`,
    ],
    { url: p.url, label: 'Set your password' },
  );
}

export function passwordResetMail(p: { name: string; url: string }): MailContent {
  return render(
    'Reset your Swardkeep password',
    [
      `Hello ${p.name},`,
      'Someone asked to reset the password of your Swardkeep account. If it was not you, ignore this message: nothing changes.',
      'The link works once and expires in one hour.',
    ],
    { url: p.url, label: 'Choose a new password' },
  );
}

type ProposalRef = { reference: string; title: string; url: string };

export function proposalSubmittedMail(p: ProposalRef & { name: string; by: string; decisionDue: string }): MailContent {
  return render(
    `Proposal ${p.reference} submitted for assessment`,
    [`Hello ${p.name},`, `${p.by} has submitted proposal ${p.reference}, "${p.title}", for assessment.`, `The decision is due by ${p.decisionDue}.`],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function proposalReturnedMail(p: ProposalRef & { name: string; by: string; reason: string }): MailContent {
  return render(
    `Proposal ${p.reference} returned: more information needed`,
    [`Hello ${p.name},`, `${p.by} has returned proposal ${p.reference}, "${p.title}", and asks for more information:`, p.reason, 'Edit the proposal and submit it again; the decision period starts again from the new submission.'],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function assessmentSignedMail(p: ProposalRef & { name: string; by: string; number: number; level: string; co2e: string; forChair: boolean }): MailContent {
  return render(
    `Assessment of ${p.reference} signed off`,
    [
      `Hello ${p.name},`,
      `${p.by} has signed off assessment ${p.number} of proposal ${p.reference}, "${p.title}".`,
      `Risk: ${p.level}. Estimated emissions over the transition period: ${p.co2e}.`,
      p.forChair ? 'It is ready to be put on a board agenda.' : 'The proposal now goes to the board.',
    ],
    { url: p.url, label: 'Read the assessment' },
  );
}

export function boardDecisionMail(p: ProposalRef & { name: string; outcome: string; reasons: string; conditions: { text: string; dueDate: string; checkedBy: string }[]; appealUntil: string | null; effectiveDate: string; registerSeq: number }): MailContent {
  const outcome = { approved: 'approved', 'approved-with-conditions': 'approved with conditions', refused: 'refused' }[p.outcome] ?? p.outcome;
  return render(
    `Board decision on ${p.reference}: ${outcome}`,
    [
      `Hello ${p.name},`,
      `The board has decided on proposal ${p.reference}, "${p.title}": ${outcome}.`,
      `Reasons: ${p.reasons}`,
      ...p.conditions.map((c, i) => `Condition ${i + 1}: ${c.text} (due ${c.dueDate}; checked by ${c.checkedBy}).`),
      `Effective from ${p.effectiveDate}.${p.appealUntil ? ` An appeal may be lodged until ${p.appealUntil}; local law sets how.` : ''}`,
      `The decision is entry ${p.registerSeq} of the public register.`,
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}
