/**
 * Cairn's e-mail layout: one content description rendered twice, as HTML
 * that common mail clients show well (table layout, inline CSS only, dark text
 * on a light background, no image or font fetched from anywhere) and as plain
 * text. Pure functions; mail-layout.spec.ts checks both parts.
 */

export type MailBlock =
  | { type: 'paragraph'; text: string }
  | { type: 'facts'; rows: { label: string; value: string }[] }
  | { type: 'action'; label: string; url: string; note?: string }
  | { type: 'caution'; title: string; text: string };

export interface MailContent {
  subject: string;
  /** The line mail clients show after the subject in a list */
  preheader: string;
  /** Who the message comes from, under the wordmark: the region's name */
  regionName: string;
  greeting: string;
  blocks: MailBlock[];
  /** Why this person receives the message and how to stop it */
  footer: string[];
}

export interface RenderedMail {
  subject: string;
  html: string;
  text: string;
}

// Cairn's palette (packages/web/src/styles/tokens.css), as literal values: mail clients drop
// custom properties.
const C = {
  surface: '#f7f5f0',
  raised: '#ffffff',
  text: '#1c2127',
  muted: '#5f6b7c',
  border: '#d8d2c4',
  brand900: '#12303a',
  brand100: '#dcebef',
  ochre: '#e0a43a',
  sand: '#e7ddc8',
};
const FONT = "font-family:Lato,'Segoe UI',Helvetica,Arial,sans-serif";

export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** Only http(s) links are ever written into a message. */
function safeUrl(url: string): string {
  const parsed = new URL(url);
  if (parsed.protocol !== 'https:' && parsed.protocol !== 'http:')
    throw new Error(`refusing a ${parsed.protocol} link in an e-mail`);
  return parsed.href;
}

function blockHtml(block: MailBlock): string {
  switch (block.type) {
    case 'paragraph':
      return `<p style="margin:0 0 16px;${FONT};font-size:16px;line-height:24px;color:${C.text}">${escapeHtml(block.text)}</p>`;
    case 'facts':
      return (
        `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="margin:0 0 20px;border-collapse:collapse;border-top:1px solid ${C.border}">` +
        block.rows
          .map(
            (r) =>
              `<tr><th scope="row" align="left" valign="top" style="padding:8px 12px 8px 0;border-bottom:1px solid ${C.border};${FONT};font-size:14px;line-height:20px;font-weight:bold;color:${C.muted};width:40%">${escapeHtml(r.label)}</th>` +
              `<td valign="top" style="padding:8px 0;border-bottom:1px solid ${C.border};${FONT};font-size:15px;line-height:20px;color:${C.text}">${escapeHtml(r.value)}</td></tr>`,
          )
          .join('') +
        '</table>'
      );
    case 'action': {
      const href = escapeHtml(safeUrl(block.url));
      return (
        `<table role="presentation" cellpadding="0" cellspacing="0" border="0" style="margin:0 0 ${block.note ? 4 : 16}px"><tr>` +
        `<td bgcolor="${C.brand100}" style="background:${C.brand100};border:1px solid ${C.brand900};border-radius:4px">` +
        `<a href="${href}" style="display:inline-block;padding:10px 18px;${FONT};font-size:15px;font-weight:bold;color:${C.brand900};text-decoration:underline">${escapeHtml(block.label)}</a>` +
        '</td></tr></table>' +
        (block.note
          ? `<p style="margin:0 0 16px;${FONT};font-size:13px;line-height:18px;color:${C.muted}">${escapeHtml(block.note)}</p>`
          : '')
      );
    }
    case 'caution':
      return (
        `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="margin:0 0 16px"><tr>` +
        `<td bgcolor="${C.surface}" style="background:${C.surface};border-left:4px solid ${C.ochre};padding:10px 14px;${FONT};font-size:14px;line-height:20px;color:${C.text}">` +
        `<strong>${escapeHtml(block.title)}.</strong> ${escapeHtml(block.text)}</td></tr></table>`
      );
  }
}

function blockText(block: MailBlock): string {
  switch (block.type) {
    case 'paragraph':
      return wrap(block.text);
    case 'facts': {
      const width = Math.max(...block.rows.map((r) => r.label.length));
      return block.rows.map((r) => `${`${r.label}:`.padEnd(width + 2)}${r.value}`).join('\n');
    }
    case 'action':
      return `${block.label}:\n${safeUrl(block.url)}${block.note ? `\n${wrap(block.note)}` : ''}`;
    case 'caution':
      return wrap(`${block.title}. ${block.text}`);
  }
}

/** Plain text wrapped at 72 characters (words are never cut; long links stay whole). */
export function wrap(text: string, width = 72): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.join('\n');
}

export function renderMail(content: MailContent): RenderedMail {
  const body = content.blocks.map(blockHtml).join('');
  const footer = content.footer
    .map(
      (line) =>
        `<p style="margin:0 0 8px;${FONT};font-size:13px;line-height:18px;color:${C.muted}">${escapeHtml(line)}</p>`,
    )
    .join('');
  const html =
    '<!DOCTYPE html>' +
    `<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<meta name="color-scheme" content="light"><meta name="supported-color-schemes" content="light">` +
    `<title>${escapeHtml(content.subject)}</title></head>` +
    `<body style="margin:0;padding:0;background:${C.surface}">` +
    `<div style="display:none;max-height:0;overflow:hidden;mso-hide:all">${escapeHtml(content.preheader)}</div>` +
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" bgcolor="${C.surface}" style="background:${C.surface}"><tr><td align="center" style="padding:24px 12px">` +
    `<table role="presentation" width="600" cellpadding="0" cellspacing="0" border="0" style="width:100%;max-width:600px;border-collapse:collapse">` +
    // Wordmark and region: text, never an image.
    `<tr><td style="padding:0 0 12px;${FONT};font-size:22px;line-height:28px;font-weight:bold;color:${C.brand900}">Cairn` +
    `<span style="font-size:14px;font-weight:normal;color:${C.muted}">&nbsp;&middot;&nbsp;${escapeHtml(content.regionName)}</span></td></tr>` +
    `<tr><td height="4" bgcolor="${C.ochre}" style="background:${C.ochre};font-size:0;line-height:0;height:4px">&nbsp;</td></tr>` +
    `<tr><td bgcolor="${C.raised}" style="background:${C.raised};border:1px solid ${C.border};border-top:0;padding:24px 28px">` +
    `<p style="margin:0 0 16px;${FONT};font-size:16px;line-height:24px;color:${C.text}">${escapeHtml(content.greeting)}</p>` +
    body +
    '</td></tr>' +
    `<tr><td style="padding:16px 4px 0">${footer}</td></tr>` +
    '</table></td></tr></table></body></html>';
  const text = [
    content.greeting,
    ...content.blocks.map(blockText),
    '-- ',
    ...content.footer.map((line) => wrap(line)),
    `Cairn · ${content.regionName}`,
  ].join('\n\n');
  return { subject: content.subject, html, text: `${text}\n` };
}
