// The text of the e-mails Crankwise sends. Plain text first; the HTML part says the same.

/** A rendered e-mail. */
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function html(paragraphs: string[], link: string, label: string): string {
  const body = paragraphs.map((p) => `<p>${escape(p)}</p>`).join('\n');
  return `${body}\n<p><a href="${escape(link)}">${escape(label)}</a></p>\n<p style="color:#666">${escape(link)}</p>`;
}

/** The invitation to join a shop. */
export function inviteMail(shopName: string, roleLabel: string, link: string, ttlHours: number): MailContent {
  const lines = [
    `You have been invited to join ${shopName} on Crankwise as ${roleLabel}.`,
    `Open the link below to choose your name and password. It works once and expires in ${ttlHours} hours.`,
  ];
  return {
    subject: `Your invitation to ${shopName} on Crankwise`,
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: html(lines, link, 'Accept the invitation'),
  };
}

/** The password-reset link. */
export function resetMail(link: string, ttlMinutes: number): MailContent {
  const lines = [
    'Someone asked to reset the password of your Crankwise account. If it was not you, ignore this e-mail.',
    `Open the link below to choose a new password. It works once and expires in ${ttlMinutes} minutes.`,
  ];
  return {
    subject: 'Reset your Crankwise password',
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: html(lines, link, 'Choose a new password'),
  };
}
