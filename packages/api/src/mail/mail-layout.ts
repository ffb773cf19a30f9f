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
  | { type: 'caution'; title: string; text: string }
  | { type: 'heading'; text: string }
  | { type: 'list'; items: string[] }
  | { type: 'bars'; caption: string; legend: string; rows: BarRow[] };

/**
 * One measure drawn as a bar of table cells (no image): the practice's rate filled from the
 * left, a narrow mark at the reference (the region median), both as whole percentages 0–100.
 */
export interface BarRow {
  label: string;
  /** The practice's rate, 0–100; null draws no fill */
  value: number | null;
  /** Where the mark goes, 0–100; null draws none */
  mark: number | null;
  /** Written under the label: "78% (41 of 52) · region median 81% · within the limits" */
  note: string;
}

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

const clampPercent = (v: number) => Math.min(100, Math.max(0, Math.round(v)));

/** The bar's cells, left to right: [width %, colour]. The mark is 1 % wide. */
export function barSegments(value: number | null, mark: number | null): [number, string][] {
  const v = value === null ? 0 : clampPercent(value);
  const m = mark === null ? null : Math.min(99, clampPercent(mark));
  const cuts = [...new Set([0, v, ...(m === null ? [] : [m, m + 1]), 100])].sort((a, b) => a - b);
  const segments: [number, string][] = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const from = cuts[i]!;
    const colour = m !== null && from === m ? C.ochre : from < v ? C.brand900 : C.sand;
    const last = segments[segments.length - 1];
    if (last && last[1] === colour) last[0] += cuts[i + 1]! - from;
    else segments.push([cuts[i + 1]! - from, colour]);
  }
  return segments;
}

/** The same bar in plain text, 40 characters: '#' the rate, '|' the mark, '.' the rest. */
export function barText(value: number | null, mark: number | null, width = 40): string {
  const v = value === null ? 0 : Math.round((clampPercent(value) / 100) * width);
  const m =
    mark === null ? -1 : Math.min(width - 1, Math.round((clampPercent(mark) / 100) * width));
  let bar = '';
  for (let i = 0; i < width; i++) bar += i === m ? '|' : i < v ? '#' : '.';
  return `[${bar}]`;
}

function barsHtml(block: Extract<MailBlock, { type: 'bars' }>): string {
  const rows = block.rows
    .map((row) => {
      const cells = barSegments(row.value, row.mark)
        .map(
          ([width, colour]) =>
            `<td width="${width}%" height="12" bgcolor="${colour}" style="width:${width}%;height:12px;background:${colour};font-size:0;line-height:0">&nbsp;</td>`,
        )
        .join('');
      return (
        `<tr><td style="padding:10px 0 2px;${FONT};font-size:14px;line-height:18px;font-weight:bold;color:${C.text}">${escapeHtml(row.label)}</td></tr>` +
        `<tr><td style="padding:0"><table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="border-collapse:collapse;border:1px solid ${C.border}"><tr>${cells}</tr></table></td></tr>` +
        `<tr><td style="padding:2px 0 0;${FONT};font-size:13px;line-height:18px;color:${C.muted}">${escapeHtml(row.note)}</td></tr>`
      );
    })
    .join('');
  return (
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="margin:0 0 16px;border-collapse:collapse">` +
    `<caption align="top" style="text-align:left;padding:0 0 4px;${FONT};font-size:13px;line-height:18px;color:${C.muted}">${escapeHtml(block.caption)}</caption>` +
    rows +
    '</table>' +
    `<p style="margin:0 0 16px;${FONT};font-size:13px;line-height:18px;color:${C.muted}">${escapeHtml(block.legend)}</p>`
  );
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
    case 'heading':
      return `<h2 style="margin:24px 0 8px;${FONT};font-size:18px;line-height:24px;font-weight:bold;color:${C.brand900}">${escapeHtml(block.text)}</h2>`;
    case 'list':
      return (
        `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="margin:0 0 16px">` +
        block.items
          .map(
            (item) =>
              `<tr><td valign="top" width="18" style="width:18px;padding:0 0 8px;${FONT};font-size:15px;line-height:22px;color:${C.brand900}">&bull;</td>` +
              `<td valign="top" style="padding:0 0 8px;${FONT};font-size:15px;line-height:22px;color:${C.text}">${escapeHtml(item)}</td></tr>`,
          )
          .join('') +
        '</table>'
      );
    case 'bars':
      return barsHtml(block);
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
    case 'heading':
      return `${block.text}\n${'='.repeat(Math.min(72, block.text.length))}`;
    case 'list':
      return block.items.map((item) => wrap(`- ${item}`).replace(/\n/g, '\n  ')).join('\n');
    case 'bars':
      return [
        wrap(block.caption),
        ...block.rows.map(
          (row) => `${row.label}\n${barText(row.value, row.mark)}\n${wrap(row.note)}`,
        ),
        wrap(block.legend),
      ].join('\n\n');
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
