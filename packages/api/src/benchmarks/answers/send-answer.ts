/**
 * Sends a stored answer over HTTP: brotli when the reader accepts it and the
 * answer has its brotli form, else gzip as stored when the reader accepts it,
 * plain JSON otherwise. Private: the answers are per reader's access.
 *
 * Entity tags: each form sent has its own strong tag (RFC 9110 §8.8.3: a
 * strong validator changes with the content coding), the answer's tag for
 * plain JSON and the same with `-gzip` or `-br` before its closing quote for
 * the compressed forms. The forms hold the same JSON, so If-None-Match with
 * the tag of any form of this answer gives 304 (with the tag of the form this
 * request would get); a tag of any other answer does not.
 */
import type { Request, Response } from 'express';
import type { StoredAnswer } from './stored-answers.service.js';

type Coding = 'br' | 'gzip' | null;

/** The form this request gets: brotli, then gzip, as the reader accepts them. */
function codingFor(accepts: string, answer: StoredAnswer): Coding {
  if (answer.brotli && /\bbr\b/.test(accepts)) return 'br';
  if (/\bgzip\b/.test(accepts)) return 'gzip';
  return null;
}

/** The strong tag of one form of the answer. */
export function formTag(answer: Pick<StoredAnswer, 'etag'>, coding: Coding): string {
  return coding ? `${answer.etag.slice(0, -1)}-${coding}"` : answer.etag;
}

/** Whether If-None-Match names a form of this answer (weak comparison, or `*`). */
function matches(header: string | undefined, answer: Pick<StoredAnswer, 'etag'>): boolean {
  if (!header) return false;
  return header
    .split(',')
    .map((t) =>
      t
        .trim()
        .replace(/^W\//, '')
        .replace(/-(?:br|gzip)"$/, '"'),
    )
    .some((t) => t === answer.etag || t === '*');
}

export function sendAnswer(req: Request, res: Response, answer: StoredAnswer): void {
  const coding = codingFor(req.headers['accept-encoding'] ?? '', answer);
  res.setHeader('ETag', formTag(answer, coding));
  res.setHeader('Cache-Control', 'private, no-cache');
  res.setHeader('Vary', 'Accept-Encoding, Cookie');
  if (matches(req.headers['if-none-match'], answer)) {
    res.status(304).end();
    return;
  }
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  const body = coding === 'br' ? answer.brotli! : coding === 'gzip' ? answer.gzip : answer.plain;
  if (coding) res.setHeader('Content-Encoding', coding);
  res.setHeader('Content-Length', String(body.length));
  res.status(200).end(body);
}
