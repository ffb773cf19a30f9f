/** The local fakes: SMTP capture and its mailbox, and their refusal outside development/test. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import request from 'supertest';
import type { CairnConfig } from '../src/config/config.schema.js';
import { loadConfig } from '../src/config/load-config.js';
import { assertDevFakesAllowed, type DevFakes, startDevFakes } from '../src/dev/fakes.js';
import { freePort } from './support/ports.js';

describe('local fakes', () => {
  let fakes: DevFakes;
  let config: CairnConfig;

  beforeAll(async () => {
    const base = loadConfig({ profile: 'test' });
    config = {
      ...base,
      devFakes: {
        ...base.devFakes,
        port: await freePort(),
        smtpPort: await freePort(),
        dataDir: mkdtempSync(join(tmpdir(), 'cairn-fakes-')),
      },
    };
    fakes = await startDevFakes(config);
  });
  afterAll(async () => {
    await fakes?.close();
  });

  it('captures an e-mail with its attachment byte for byte', async () => {
    const transport = nodemailer.createTransport({
      host: '127.0.0.1',
      port: config.devFakes.smtpPort,
      secure: false,
      ignoreTLS: true,
    });
    const attachment = Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0xff, 0x10]);
    await transport.sendMail({
      from: 'Cairn <no-reply@cairn.invalid>',
      to: 'lead@practice.example',
      subject: 'Your quarterly digest',
      text: 'Plain text',
      html: '<p>Hello <strong>there</strong></p>',
      attachments: [{ filename: 'pack.xlsx', content: attachment }],
    });
    const list = await request(fakes.app).get('/mailbox/api/messages').expect(200);
    expect(list.body).toHaveLength(1);
    const [message] = list.body;
    expect(message).toMatchObject({
      subject: 'Your quarterly digest',
      to: ['lead@practice.example'],
    });
    expect(message.attachments).toEqual([
      expect.objectContaining({ filename: 'pack.xlsx', size: attachment.length }),
    ]);
    const file = await request(fakes.app)
      .get(`/mailbox/${message.id}/attachments/0`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(Buffer.compare(file.body as Buffer, attachment)).toBe(0);
    const html = await request(fakes.app).get(`/mailbox/${message.id}`).expect(200);
    expect(html.text).toContain('Your quarterly digest');
    expect(html.text).toContain('sandbox=""');
  });

  it('lists messages on the mailbox page and can be emptied', async () => {
    const page = await request(fakes.app).get('/mailbox').expect(200);
    expect(page.text).toContain('Your quarterly digest');
    await request(fakes.app).delete('/mailbox/api/messages').expect(204);
    expect((await request(fakes.app).get('/mailbox/api/messages')).body).toEqual([]);
  });

  it('refuses to run in production or when disabled', () => {
    expect(() => assertDevFakesAllowed({ ...config, profile: 'production' })).toThrow(
      /never run in production/,
    );
    expect(() =>
      assertDevFakesAllowed({ ...config, devFakes: { ...config.devFakes, enabled: false } }),
    ).toThrow(/disabled/);
    const saved = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      expect(() => assertDevFakesAllowed(config)).toThrow(/never run in production/);
    } finally {
      process.env.NODE_ENV = saved;
    }
  });
});
