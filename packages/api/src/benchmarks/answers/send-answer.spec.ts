import type { Request, Response } from 'express';
import { formTag, sendAnswer } from './send-answer.js';
import type { StoredAnswer } from './stored-answers.service.js';

const key = 'a'.repeat(64);
const answer: StoredAnswer = {
  key,
  etag: `"${key}"`,
  plain: Buffer.from('{"n":1}'),
  gzip: Buffer.from('gzip bytes'),
  brotli: Buffer.from('br bytes'),
};

/** What sendAnswer sent for a request with these headers. */
function send(headers: Record<string, string>, stored: StoredAnswer = answer) {
  const sent: { status?: number; headers: Record<string, string>; body?: Buffer } = {
    headers: {},
  };
  const res = {
    setHeader(name: string, value: string) {
      sent.headers[name.toLowerCase()] = value;
      return res;
    },
    status(code: number) {
      sent.status = code;
      return res;
    },
    end(body?: Buffer) {
      sent.body = body;
      return res;
    },
  };
  sendAnswer({ headers } as unknown as Request, res as unknown as Response, stored);
  return sent;
}

describe('sendAnswer', () => {
  it('gives each form its own strong tag: plain, gzip and brotli', () => {
    const plain = send({});
    const gzip = send({ 'accept-encoding': 'gzip, deflate' });
    const br = send({ 'accept-encoding': 'gzip, deflate, br' });
    expect(plain).toMatchObject({ status: 200, body: answer.plain });
    expect(plain.headers.etag).toBe(`"${key}"`);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(gzip).toMatchObject({ status: 200, body: answer.gzip });
    expect(gzip.headers.etag).toBe(`"${key}-gzip"`);
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(br).toMatchObject({ status: 200, body: answer.brotli });
    expect(br.headers.etag).toBe(`"${key}-br"`);
    expect(br.headers['content-encoding']).toBe('br');
    for (const s of [plain, gzip, br]) {
      expect(s.headers['content-length']).toBe(String(s.body!.length));
      expect(s.headers.vary).toBe('Accept-Encoding, Cookie');
    }
  });

  it('sends gzip, tagged as gzip, while the answer has no brotli form yet', () => {
    const sent = send({ 'accept-encoding': 'br, gzip' }, { ...answer, brotli: null });
    expect(sent.body).toBe(answer.gzip);
    expect(sent.headers.etag).toBe(`"${key}-gzip"`);
  });

  it('answers 304 to the tag of any form of the answer, with the tag of the form asked for', () => {
    for (const coding of ['br', 'gzip', null] as const) {
      const given = formTag(answer, coding);
      for (const header of [given, `W/${given}`, `"other", ${given}`, '*']) {
        const plain = send({ 'if-none-match': header });
        expect(plain.status).toBe(304);
        expect(plain.body).toBeUndefined();
        expect(plain.headers.etag).toBe(`"${key}"`);
        const br = send({ 'if-none-match': header, 'accept-encoding': 'br' });
        expect(br.status).toBe(304);
        expect(br.headers.etag).toBe(`"${key}-br"`);
      }
    }
  });

  it('answers 200 to the tag of another answer, or a tag that only looks like one of its forms', () => {
    const other = `"${'b'.repeat(64)}`;
    for (const header of [`${other}"`, `${other}-gzip"`, `"${key}-deflate"`, `"${key}x"`, key]) {
      const sent = send({ 'if-none-match': header, 'accept-encoding': 'gzip' });
      expect(sent.status).toBe(200);
      expect(sent.body).toBe(answer.gzip);
    }
  });
});
