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
