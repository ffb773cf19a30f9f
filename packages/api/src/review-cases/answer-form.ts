/**
 * Reads a practice's answer from a multipart request (busboy): the fields
 * `text` and `expectedVersion` and up to ATTACHMENTS_PER_ANSWER parts named
 * `files`, each cut at ATTACHMENT_MAX_BYTES and then checked by content
 * (attachment-check.ts). Everything is read before anything is stored, so a
 * refused file leaves nothing behind.
 */
import { HttpStatus } from '@nestjs/common';
import busboy from 'busboy';
import type { Request } from 'express';
import { ProblemException } from '../common/problem.js';
import {
  ATTACHMENT_MAX_BYTES,
  ATTACHMENTS_PER_ANSWER,
  checkAttachment,
} from './attachment-check.js';
import type { ReceivedFile } from './review-cases.service.js';

export interface AnswerForm {
  text: string;
  expectedVersion: number | null;
  files: ReceivedFile[];
}

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f]/g;
const cleanName = (name: string) =>
  (
    name
      .replace(/^.*[\\/]/, '')
      .replace(CONTROL, '')
      .trim() || 'attachment'
  ).slice(0, 255);

export async function readAnswerForm(req: Request): Promise<AnswerForm> {
  if (!String(req.headers['content-type'] ?? '').startsWith('multipart/form-data')) {
    throw new ProblemException(
      HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      'answer-not-multipart',
      'Send the answer as a form',
      'An answer is sent as multipart/form-data with a "text" field and files in parts named "files".',
    );
  }
  const fields: Record<string, string> = {};
  const received: { name: string; chunks: Buffer[]; truncated: boolean }[] = [];
  let tooMany = false;
  await new Promise<void>((resolve, reject) => {
    const parser = busboy({
      headers: req.headers,
      limits: {
        files: ATTACHMENTS_PER_ANSWER,
        fileSize: ATTACHMENT_MAX_BYTES,
        fields: 10,
        fieldSize: 64 * 1024,
      },
    });
    parser.on('field', (name, value) => (fields[name] = value));
    parser.on('file', (field, stream, info) => {
      if (field !== 'files') {
        stream.resume();
        return;
      }
      const file = {
        name: cleanName(info.filename ?? ''),
        chunks: [] as Buffer[],
        truncated: false,
      };
      received.push(file);
      stream.on('data', (chunk: Buffer) => file.chunks.push(chunk));
      stream.on('limit', () => (file.truncated = true));
    });
    parser.on('filesLimit', () => (tooMany = true));
    parser.on('close', () => resolve());
    parser.on('error', (error) => reject(error));
    req.pipe(parser);
  }).catch(() => {
    throw new ProblemException(
      HttpStatus.BAD_REQUEST,
      'upload-malformed',
      'The form could not be read',
      'The multipart form was cut short or malformed. Nothing was stored; send it again.',
    );
  });
  if (tooMany) {
    throw new ProblemException(
      HttpStatus.PAYLOAD_TOO_LARGE,
      'too-many-attachments',
      'Too many attachments',
      `An answer takes at most ${ATTACHMENTS_PER_ANSWER} attachments. Nothing was stored.`,
      { errors: [{ field: 'files', message: `at most ${ATTACHMENTS_PER_ANSWER}` }] },
    );
  }
  const files = received.map((f) => {
    const bytes = Buffer.concat(f.chunks);
    return { fileName: f.name, kind: checkAttachment(f.name, bytes, f.truncated), bytes };
  });
  const version = fields.expectedVersion;
  return {
    text: fields.text ?? '',
    expectedVersion: version !== undefined && /^\d+$/.test(version) ? Number(version) : null,
    files,
  };
}
