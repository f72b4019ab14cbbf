import { getConfig } from '../config';
import type { MailMessage } from './send-mail';

/** What one message says: a heading, short paragraphs, one button, a closing note. */
export type MailContent = {
  to: string;
  subject: string;
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footer?: string;
};

/** Escapes text for HTML: every value a person typed goes through here. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/**
 * An absolute link for a message: from PUBLIC_URL when set, else the origin of the request that
 * caused the message (a link in an e-mail is opened on another device, so never relative).
 */
export function absoluteUrl(pathAndQuery: string, requestOrigin: string): string {
  return new URL(pathAndQuery, getConfig().publicUrl ?? requestOrigin).toString();
}

/**
 * Renders a message as a plain-text part and a simple HTML part: one column, large text and a
 * large button that works on a phone, the link also written out for clients that hide buttons.
 */
export function renderMail(content: MailContent): MailMessage {
  const text = [
    content.heading,
    '',
    ...content.paragraphs.flatMap((p) => [p, '']),
    ...(content.action ? [`${content.action.label}:`, content.action.url, ''] : []),
    '-- ',
    content.footer ?? 'Gullyline: fence lines across creeks and gullies.',
  ].join('\n');
  const paragraph = (p: string) => `<p style="margin:0 0 16px;font-size:16px;line-height:1.5;color:#2b2118">${escapeHtml(p)}</p>`;
  const button = content.action
    ? `<p style="margin:24px 0"><a href="${escapeHtml(content.action.url)}" style="display:inline-block;padding:14px 22px;border-radius:8px;background:#3f6b3a;color:#ffffff;font-size:17px;font-weight:bold;text-decoration:none">${escapeHtml(content.action.label)}</a></p>` +
      `<p style="margin:0 0 16px;font-size:14px;line-height:1.4;color:#5c4d3f;word-break:break-all">Or open this link: <a href="${escapeHtml(content.action.url)}" style="color:#3f6b3a">${escapeHtml(content.action.url)}</a></p>`
    : '';
  const html = `<!doctype html>
<html lang="en-AU"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(content.subject)}</title></head>
<body style="margin:0;padding:0;background:#f6f1e7;font-family:'Noto Sans',Arial,sans-serif">
<div style="max-width:560px;margin:0 auto;padding:24px 16px">
<p style="margin:0 0 16px;font-size:14px;font-weight:bold;color:#3f6b3a">Gullyline</p>
<div style="background:#ffffff;border-radius:12px;padding:24px 20px">
<h1 style="margin:0 0 16px;font-size:22px;line-height:1.3;color:#2b2118">${escapeHtml(content.heading)}</h1>
${content.paragraphs.map(paragraph).join('\n')}
${button}
</div>
<p style="margin:16px 0 0;font-size:13px;line-height:1.4;color:#7a6a5a">${escapeHtml(content.footer ?? 'Gullyline: fence lines across creeks and gullies.')}</p>
</div>
</body></html>`;
  return { to: content.to, subject: content.subject, text, html };
}

/** The invitation message: who invites, to which property, with what role, and until when. */
export function invitationMail(input: {
  to: string;
  propertyName: string;
  inviterName: string;
  role: string;
  acceptUrl: string;
  expiresAt: Date;
}): MailMessage {
  const until = input.expiresAt.toLocaleDateString('en-AU', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
  return renderMail({
    to: input.to,
    subject: `${input.inviterName} invited you to ${input.propertyName} on Gullyline`,
    heading: `Join ${input.propertyName}`,
    paragraphs: [
      `${input.inviterName} invited you to work on ${input.propertyName} as ${input.role === 'owner' ? 'an' : 'a'} ${input.role}.`,
      `Open the link to accept. If you have no Gullyline account yet, you can create one with this e-mail address (${input.to}). The link works once and until ${until}.`,
    ],
    action: { label: 'Accept the invitation', url: input.acceptUrl },
    footer: 'If you did not expect this invitation, ignore this message: nothing happens unless you accept.',
  });
}
