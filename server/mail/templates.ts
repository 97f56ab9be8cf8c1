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

/**
 * Sent instead of an invitation when the invited address already has an account in another shop:
 * the inviting admin gets the same answer as for any invite (no hint that the address is known),
 * and the owner of the address learns what happened and what to do.
 */
export function inviteExistingAccountMail(shopName: string, publicUrl: string): MailContent {
  const lines = [
    `An admin of ${shopName} invited this address to join their shop on Crankwise.`,
    'This address already has a Crankwise account in another shop, and an address belongs to one shop only, so no invitation link was created for you.',
    `If you want to join ${shopName}, ask them to invite a different address. If you did not expect this, you can ignore this e-mail; your account is unchanged.`,
  ];
  const body = lines.map((p) => `<p>${escape(p)}</p>`).join('\n');
  return {
    subject: `${shopName} tried to invite you to Crankwise`,
    text: `${lines.join('\n\n')}\n\nSign in: ${publicUrl}/sign-in\n`,
    html: `${body}\n<p><a href="${escape(`${publicUrl}/sign-in`)}">Sign in to your account</a></p>`,
  };
}
