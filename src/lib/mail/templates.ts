/** Mail texts (pure: data in, subject/text/html out). Plain words, no tracking, no images. */
import { formatDate } from '../format/dates';
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

export function invitationMail(p: {
  name: string;
  invitedBy: string;
  roles: string;
  url: string;
  expiresDays: number;
}): MailContent {
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
    [
      `Hello ${p.name},`,
      `${p.by} has submitted proposal ${p.reference}, "${p.title}", for assessment.`,
      `The decision is due by ${formatDate(p.decisionDue)}.`,
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function proposalReturnedMail(p: ProposalRef & { name: string; by: string; reason: string }): MailContent {
  return render(
    `Proposal ${p.reference} returned: more information needed`,
    [
      `Hello ${p.name},`,
      `${p.by} has returned proposal ${p.reference}, "${p.title}", and asks for more information:`,
      p.reason,
      'Edit the proposal and submit it again; the decision period starts again from the new submission.',
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function assessmentSignedMail(
  p: ProposalRef & { name: string; by: string; number: number; level: string; co2e: string; forChair: boolean },
): MailContent {
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

export function boardDecisionMail(
  p: ProposalRef & {
    name: string;
    outcome: string;
    reasons: string;
    conditions: { text: string; dueDate: string; checkedBy: string }[];
    appealUntil: string | null;
    effectiveDate: string;
    registerSeq: number;
  },
): MailContent {
  const outcome =
    { approved: 'approved', 'approved-with-conditions': 'approved with conditions', refused: 'refused' }[p.outcome] ??
    p.outcome;
  return render(
    `Board decision on ${p.reference}: ${outcome}`,
    [
      `Hello ${p.name},`,
      `The board has decided on proposal ${p.reference}, "${p.title}": ${outcome}.`,
      `Reasons: ${p.reasons}`,
      ...p.conditions.map(
        (c, i) => `Condition ${i + 1}: ${c.text} (due ${formatDate(c.dueDate)}; checked by ${c.checkedBy}).`,
      ),
      `Effective from ${formatDate(p.effectiveDate)}.${
        p.appealUntil ? ` An appeal may be lodged ` + `until ${formatDate(p.appealUntil)}; local law sets how.` : ''
      }`,
      `The decision is entry ${p.registerSeq} of the public register.`,
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function decisionDueMail(
  p: ProposalRef & { name: string; decisionDue: string; daysLeft: number; state: string },
): MailContent {
  const when =
    p.daysLeft === 0 ? 'today' : `in ${p.daysLeft} day${p.daysLeft === 1 ? '' : 's'}, on ${formatDate(p.decisionDue)}`;
  return render(
    `Decision on ${p.reference} due ${p.daysLeft === 0 ? 'today' : `by ${formatDate(p.decisionDue)}`}`,
    [
      `Hello ${p.name},`,
      `The decision on proposal ${p.reference}, "${p.title}", is due ${when}. The proposal is now "${p.state}".`,
      'The decision period is set by local law; check what it allows if the decision cannot be made in time.',
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function decisionOverdueMail(
  p: ProposalRef & { name: string; decisionDue: string; daysOver: number; state: string },
): MailContent {
  return render(
    `Decision on ${p.reference} is overdue`,
    [
      `Hello ${p.name},`,
      `The decision on proposal ${p.reference}, "${p.title}", was due on ${formatDate(p.decisionDue)},` +
        ` ${p.daysOver} day${p.daysOver === 1 ? '' : 's'} ago. The proposal is still "${p.state}".`,
      'Local law says what follows from a missed decision period; check it with your legal adviser.',
    ],
    { url: p.url, label: 'Open the proposal' },
  );
}

export function followUpOverdueMail(
  p: ProposalRef & { name: string; task: string; dueDate: string; checkedBy: string },
): MailContent {
  return render(
    `Follow-up overdue on ${p.reference}`,
    [
      `Hello ${p.name},`,
      `A follow-up of the decision on proposal ${p.reference}, "${p.title}", was due on ${formatDate(p.dueDate)} and has no outcome yet:`,
      p.task,
      `Checked by: ${p.checkedBy}. Record the outcome, with evidence, on the follow-ups page.`,
    ],
    { url: p.url, label: 'Open the follow-ups' },
  );
}

export function compensationReversedMail(
  p: ProposalRef & {
    name: string;
    parcel: string;
    eventDate: string;
    event: string;
    permanenceUntil: string;
    creditedCo2e: string | null;
    registerSeq: number;
  },
): MailContent {
  return render(
    `Compensation for ${p.reference} reversed: parcel ${p.parcel} ploughed`,
    [
      `Hello ${p.name},`,
      `Parcel ${p.parcel} was restored to grassland as compensation for proposal ${p.reference}, "${p.title}", and ` +
        `had to stay in grass until ${formatDate(p.permanenceUntil)}.`,
      p.creditedCo2e
        ? `The land-use record now shows ${p.event} on ${formatDate(p.eventDate)}. The ${p.creditedCo2e} credited ` +
          `for it has been taken back in register entry ${p.registerSeq} and counts again in the year's committed emissions.`
        : `The land-use record now shows ${p.event} on ${formatDate(p.eventDate)}. A condition of register ` +
          `entry ${p.registerSeq} required the parcel restored; no gain was credited for it, so the register is unchanged.`,
      'A follow-up task asks you to put this before the board. What the authority can require of the holder is a matter for local law.',
    ],
    { url: p.url, label: 'Open the follow-ups' },
  );
}
