import type { MailContent } from '../transport';

/** The pieces every message is made of; the HTML and the plain-text parts are both built from them, so they always say the same. */
export interface MessageParts {
  subject: string;
  studioName: string;
  /** A short line some mail apps show beside the subject. */
  preview: string;
  greeting: string;
  paragraphs: string[];
  /** The one thing to do, as a button (HTML) or a labelled link (text). */
  action?: { label: string; url: string };
  /** Lines after the button, e.g. how long the link works. */
  after?: string[];
  /** Why this message came, in one sentence. */
  reason: string;
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes text for HTML element content and quoted attributes. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ESCAPES[c]!);
}

// Colours from the product palette (ink, paper, chalk, sun, stone); inline styles because many
// mail apps ignore <style> blocks.
const INK = '#172033';
const INK_SOFT = '#4a5468';
const PAPER = '#F7F4EE';
const CHALK = '#FFFFFF';
const SUN = '#F2A541';

/** Renders the parts as a complete message: subject, plain text and a simple table-based HTML page. */
export function renderMessage(message: MessageParts): MailContent {
  // A studio name ending in a full stop ("… Co.") at the end of a sentence would give "..".
  const tidy = (line: string) => line.replace(/(?<!\.)\.\.(?=\s|$)/g, '.');
  const parts: MessageParts = {
    ...message,
    greeting: tidy(message.greeting),
    paragraphs: message.paragraphs.map(tidy),
    after: message.after?.map(tidy),
    reason: tidy(message.reason),
  };
  const text = [
    parts.greeting,
    '',
    ...parts.paragraphs.flatMap((p) => [p, '']),
    ...(parts.action ? [`${parts.action.label}: ${parts.action.url}`, ''] : []),
    ...(parts.after ?? []).flatMap((p) => [p, '']),
    `${parts.studioName}`,
    '',
    '--',
    parts.reason,
    '',
  ].join('\n');

  const p = (line: string) => `<p style="margin:0 0 16px;font-size:16px;line-height:1.6;color:${INK}">${escapeHtml(line)}</p>`;
  const button = parts.action
    ? `<p style="margin:24px 0"><a href="${escapeHtml(parts.action.url)}" style="display:inline-block;background:${INK};color:${PAPER};text-decoration:none;font-weight:700;padding:12px 20px;border-radius:10px">${escapeHtml(parts.action.label)}</a></p>
<p style="margin:0 0 16px;font-size:13px;line-height:1.5;color:${INK_SOFT}">If the button does not work, copy this address into your browser:<br><a href="${escapeHtml(parts.action.url)}" style="color:${INK};word-break:break-all">${escapeHtml(parts.action.url)}</a></p>`
    : '';
  const html = `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${escapeHtml(parts.subject)}</title></head>
<body style="margin:0;padding:0;background:${PAPER};font-family:'Nunito Sans',Arial,sans-serif">
<span style="display:none;max-height:0;overflow:hidden">${escapeHtml(parts.preview)}</span>
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${PAPER}">
<tr><td align="center" style="padding:24px 12px">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:560px;background:${CHALK};border-radius:10px">
<tr><td style="padding:20px 28px;border-bottom:4px solid ${SUN};font-size:18px;font-weight:800;color:${INK}">${escapeHtml(parts.studioName)}</td></tr>
<tr><td style="padding:28px">
${p(parts.greeting)}
${parts.paragraphs.map(p).join('\n')}
${button}
${(parts.after ?? []).map(p).join('\n')}
</td></tr>
</table>
<p style="max-width:560px;margin:16px auto 0;font-size:12px;line-height:1.5;color:${INK_SOFT}">${escapeHtml(parts.reason)}</p>
</td></tr>
</table>
</body>
</html>
`;
  return { subject: parts.subject, text, html };
}

/** "Sam" from "Sam Rivera"; a plain "there" when we have no name. */
export function firstName(name: string | null | undefined): string {
  return name?.trim().split(/\s+/)[0] || 'there';
}
