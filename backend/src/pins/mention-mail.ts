import type { OutgoingMail } from '../mail/mail.service';

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function excerpt(text: string, max = 600): string {
  const clean = text.trim();
  return clean.length <= max ? clean : `${clean.slice(0, max - 1)}…`;
}

/** The notification a team member gets when mentioned in a pin or a reply. Plain text first; the HTML escapes everything. */
export function mentionMail(input: { to: string; authorName: string; mapTitle: string; pinTitle: string; text: string; link: string; inReply: boolean }): OutgoingMail {
  const where = input.inReply ? `in the thread of the pin "${input.pinTitle}"` : `in the pin "${input.pinTitle}"`;
  const intro = `${input.authorName} mentioned you ${where} on the map "${input.mapTitle}":`;
  const quote = excerpt(input.text);
  const footer = 'You receive this because a member of your team mentioned your address. Replies go in the thread, not to this e-mail.';
  return {
    to: input.to,
    subject: `${input.authorName} mentioned you on "${input.mapTitle}"`,
    text: `${intro}\n\n${quote.split('\n').map((l) => `> ${l}`).join('\n')}\n\nOpen the pin:\n${input.link}\n\n${footer}\n`,
    html: `<!doctype html><html><body style="font-family:'IBM Plex Sans',Arial,sans-serif;color:#2B2D42;background:#FBFAF7;padding:24px">
<div style="max-width:520px;margin:auto;background:#fff;border:1px solid #ECEAE4;border-radius:4px;padding:24px">
<p style="margin:0 0 18px;font-weight:600;font-size:17px">Fieldbound</p>
<p style="margin:0 0 14px">${escapeHtml(intro)}</p>
<blockquote style="margin:0 0 14px;padding-left:12px;border-left:3px solid #6A4C93;white-space:pre-wrap">${escapeHtml(quote)}</blockquote>
<p style="margin:20px 0"><a href="${escapeHtml(input.link)}" style="background:#6A4C93;color:#fff;padding:9px 16px;border-radius:4px;text-decoration:none">Open the pin</a></p>
<p style="margin:0;color:#6b6d7d;font-size:13px">${escapeHtml(footer)}</p></div></body></html>`,
  };
}
