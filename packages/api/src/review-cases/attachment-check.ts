/**
 * What an attachment to a review case is, judged by its bytes, never by its
 * name: PDF (starts "%PDF-"), PNG (the 8-byte PNG signature), JPEG (FF D8 FF),
 * XLSX (a ZIP whose directory names [Content_Types].xml and xl/workbook.xml)
 * and CSV (UTF-8 text without control bytes other than tab, CR and LF). The
 * signatures are those of the formats' own specifications (PDF: ISO 32000-1
 * §7.5.2; PNG: ISO/IEC 15948 §5.2; JPEG: ITU-T T.81 SOI marker; ZIP: PKWARE
 * APPNOTE local file header; XLSX: ECMA-376 Part 2 package parts). The name's
 * extension must agree with what the bytes are (a PNG named .pdf is refused).
 */
import { HttpStatus } from '@nestjs/common';
import { ProblemException } from '../common/problem.js';

export const ATTACHMENT_KINDS = {
  pdf: { mediaType: 'application/pdf', extensions: ['pdf'], label: 'PDF' },
  png: { mediaType: 'image/png', extensions: ['png'], label: 'PNG image' },
  jpeg: { mediaType: 'image/jpeg', extensions: ['jpg', 'jpeg'], label: 'JPEG image' },
  xlsx: {
    mediaType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    extensions: ['xlsx'],
    label: 'Excel workbook (XLSX)',
  },
  csv: { mediaType: 'text/csv', extensions: ['csv'], label: 'CSV text' },
} as const;
export type AttachmentKind = keyof typeof ATTACHMENT_KINDS;

/** Largest attachment accepted (bytes), and most attachments to one answer. */
export const ATTACHMENT_MAX_BYTES = 10 * 1024 * 1024;
export const ATTACHMENTS_PER_ANSWER = 5;

const ALLOWED_WORDS = 'PDF, XLSX, CSV, PNG or JPEG';

const startsWith = (bytes: Buffer, signature: readonly number[]) =>
  bytes.length >= signature.length && signature.every((b, i) => bytes[i] === b);

/** The kind the bytes are, or null when they are none of the accepted kinds. */
export function kindOfBytes(bytes: Buffer): AttachmentKind | null {
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) return 'pdf';
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'png';
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'jpeg';
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) {
    // Entry names are stored as they are in the local headers and the central directory.
    return bytes.includes('[Content_Types].xml', 0, 'latin1') &&
      bytes.includes('xl/workbook.xml', 0, 'latin1')
      ? 'xlsx'
      : null;
  }
  return isCsvText(bytes) ? 'csv' : null;
}

function isCsvText(bytes: Buffer): boolean {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return false;
  }
  // eslint-disable-next-line no-control-regex
  return text.trim().length > 0 && !/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(text);
}

export const extensionOf = (name: string): string => {
  const dot = name.lastIndexOf('.');
  return dot < 0 ? '' : name.slice(dot + 1).toLowerCase();
};

/** The attachment's kind; refuses (problem details) an empty, too large, unknown or misnamed file. */
export function checkAttachment(
  fileName: string,
  bytes: Buffer,
  truncated: boolean,
  maxBytes = ATTACHMENT_MAX_BYTES,
): AttachmentKind {
  const field = { field: 'files', file: fileName };
  if (truncated || bytes.length > maxBytes) {
    throw new ProblemException(
      HttpStatus.PAYLOAD_TOO_LARGE,
      'attachment-too-large',
      'Attachment too large',
      `"${fileName}" is larger than ${Math.round(maxBytes / 1024 / 1024)} MB, the largest attachment Cairn keeps. Nothing was stored: send a smaller file (for a spreadsheet, only the rows that matter).`,
      { ...field, maxBytes },
    );
  }
  if (bytes.length === 0) {
    throw new ProblemException(
      HttpStatus.UNPROCESSABLE_ENTITY,
      'attachment-empty',
      'Empty attachment',
      `"${fileName}" is empty. Nothing was stored.`,
      field,
    );
  }
  const kind = kindOfBytes(bytes);
  const extension = extensionOf(fileName);
  if (kind === null) {
    throw new ProblemException(
      HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      'attachment-type-not-allowed',
      'This kind of file cannot be attached',
      `"${fileName}" is not a ${ALLOWED_WORDS} file (judged by its content, not its name). Nothing was stored.`,
      { ...field, allowed: Object.keys(ATTACHMENT_KINDS) },
    );
  }
  if (!(ATTACHMENT_KINDS[kind].extensions as readonly string[]).includes(extension)) {
    throw new ProblemException(
      HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      'attachment-name-misleading',
      'The file’s name does not match its content',
      `"${fileName}" is named as ${extension ? `a .${extension} file` : 'a file without an extension'} but its content is a ${ATTACHMENT_KINDS[kind].label}. Nothing was stored: rename it to .${ATTACHMENT_KINDS[kind].extensions[0]} if that is what you meant to send.`,
      { ...field, detected: kind },
    );
  }
  return kind;
}
