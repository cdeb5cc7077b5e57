import type { OutgoingMail } from './mail.service';

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function layout(paragraphs: string[], link: { href: string; label: string }, footer: string): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
  return `<!doctype html><html><body style="font-family:'IBM Plex Sans',Arial,sans-serif;color:#2B2D42;background:#FBFAF7;padding:24px">
<div style="max-width:520px;margin:auto;background:#fff;border:1px solid #ECEAE4;border-radius:4px;padding:24px">
<p style="margin:0 0 18px;font-weight:600;font-size:17px">Fieldbound</p>${body}
<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="background:#1F6F78;color:#fff;padding:9px 16px;border-radius:4px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="margin:0;color:#6b6d7d;font-size:13px">${escapeHtml(footer)}</p></div></body></html>`;
}

function formatDate(date: Date): string {
  return date.toLocaleString('en-GB', { dateStyle: 'long', timeStyle: 'short', timeZone: 'UTC' }) + ' UTC';
}

export function invitationMail(input: { to: string; teamName: string; inviterName: string; role: string; link: string; expiresAt: Date }): OutgoingMail {
  const lines = [
    `${input.inviterName} invited you to join the research team "${input.teamName}" on Fieldbound as ${input.role === 'editor' || input.role === 'owner' ? 'an' : 'a'} ${input.role}.`,
    'Fieldbound maps where field-induced negative ions are bound, resonant or unbound over polarizability and magnetic field; the team keeps its maps and pin threads together.',
  ];
  const footer = `This link works once and expires on ${formatDate(input.expiresAt)}. If you did not expect this invitation, ignore this message.`;
  return {
    to: input.to,
    subject: `Join ${input.teamName} on Fieldbound`,
    text: `${lines.join('\n\n')}\n\nAccept the invitation:\n${input.link}\n\n${footer}\n`,
    html: layout(lines, { href: input.link, label: 'Accept the invitation' }, footer),
  };
}

export function passwordResetMail(input: { to: string; displayName: string; link: string; expiresAt: Date }): OutgoingMail {
  const lines = [`Hello ${input.displayName},`, 'someone asked to reset the password of your Fieldbound account. Choose a new password with this link:'];
  const footer = `The link works once and expires on ${formatDate(input.expiresAt)}. If you did not ask for it, ignore this message; your password stays as it is.`;
  return {
    to: input.to,
    subject: 'Reset your Fieldbound password',
    text: `${lines.join('\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(lines, { href: input.link, label: 'Choose a new password' }, footer),
  };
}

export function passwordChangedMail(input: { to: string; displayName: string; when: Date; publicUrl: string }): OutgoingMail {
  const lines = [
    `Hello ${input.displayName},`,
    `the password of your Fieldbound account was changed on ${formatDate(input.when)}, and every other signed-in device was signed out.`,
    'If this was not you, reset your password now.',
  ];
  const link = `${input.publicUrl}/forgot-password`;
  return {
    to: input.to,
    subject: 'Your Fieldbound password was changed',
    text: `${lines.join('\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Reset the password' }, 'You receive this message for the security of your account.'),
  };
}
