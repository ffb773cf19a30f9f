/**
 * Sends a stored answer over HTTP: its ETag, 304 when the reader already has
 * it (If-None-Match), brotli when the reader accepts it and the answer has its
 * brotli form, else gzip as stored when the reader accepts it, plain JSON
 * otherwise. Private: the answers are per reader's access.
 */
import type { Request, Response } from 'express';
import type { StoredAnswer } from './stored-answers.service.js';

function matches(header: string | undefined, etag: string): boolean {
  if (!header) return false;
  return header
    .split(',')
    .map((t) => t.trim().replace(/^W\//, ''))
    .some((t) => t === etag || t === '*');
}

export function sendAnswer(req: Request, res: Response, answer: StoredAnswer): void {
  res.setHeader('ETag', answer.etag);
  res.setHeader('Cache-Control', 'private, no-cache');
  res.setHeader('Vary', 'Accept-Encoding, Cookie');
  if (matches(req.headers['if-none-match'], answer.etag)) {
    res.status(304).end();
    return;
  }
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  const accepts = req.headers['accept-encoding'] ?? '';
  if (answer.brotli && /\bbr\b/.test(accepts)) {
    res.setHeader('Content-Encoding', 'br');
    res.setHeader('Content-Length', String(answer.brotli.length));
    res.status(200).end(answer.brotli);
    return;
  }
  if (/\bgzip\b/.test(accepts)) {
    res.setHeader('Content-Encoding', 'gzip');
    res.setHeader('Content-Length', String(answer.gzip.length));
    res.status(200).end(answer.gzip);
    return;
  }
  res.setHeader('Content-Length', String(answer.plain.length));
  res.status(200).end(answer.plain);
}
