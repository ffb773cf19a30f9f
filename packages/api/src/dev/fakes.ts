/**
 * The local fakes Cairn needs in development and tests, in one process:
 *  - SMTP capture on devFakes.smtpPort, with the mailbox at /mailbox
 *  - the SAML identity provider with Cairn's persona picker, under /idp (idp/fake-idp.ts)
 * Refuses to run in production or when devFakes.enabled is false.
 */
import type { Server } from 'node:http';
import { join } from 'node:path';
import express, { type Express } from 'express';
import type { SMTPServer } from 'smtp-server';
import type { CairnConfig } from '../config/config.schema.js';
import { findRepoRoot, resolvePath } from '../config/load-config.js';
import { createFakeIdp, type FakeIdp } from './idp/fake-idp.js';
import { mailboxRouter } from './mailbox-page.js';
import { Mailbox, startSmtpCapture } from './smtp-capture.js';
import { page } from './html.js';

export interface DevFakes {
  http: Server;
  smtp: SMTPServer;
  mailbox: Mailbox;
  idp: FakeIdp;
  app: Express;
  close(): Promise<void>;
}

export function assertDevFakesAllowed(config: CairnConfig): void {
  if (process.env.NODE_ENV === 'production' || config.profile === 'production') {
    throw new Error(
      'The local fakes (SAML IdP, mail capture) never run in production (NODE_ENV=production).',
    );
  }
  if (!config.devFakes.enabled) {
    throw new Error('The local fakes are disabled (devFakes.enabled is false).');
  }
}

export async function startDevFakes(config: CairnConfig): Promise<DevFakes> {
  assertDevFakesAllowed(config);
  const dataDir = resolvePath(findRepoRoot(), config.devFakes.dataDir);
  const mailbox = new Mailbox(join(dataDir, 'mailbox'));
  const idp = await createFakeIdp(config, dataDir);
  const smtp = await startSmtpCapture(mailbox, config.devFakes.host, config.devFakes.smtpPort);

  const app = express();
  app.disable('x-powered-by');
  app.use('/mailbox', mailboxRouter(mailbox));
  app.use('/idp', idp.router);
  // Browsers ask every origin for an icon; answer without a 404 in the console.
  app.get('/favicon.ico', (_req, res) => {
    res.status(204).end();
  });
  app.get('/', (_req, res) => {
    res
      .type('html')
      .send(
        page(
          'Local fakes',
          '<ul><li><a href="/mailbox">Captured e-mail</a></li><li><a href="/idp/metadata">SAML identity provider metadata</a> (sign in from Cairn to reach its persona picker)</li></ul>',
        ),
      );
  });

  const http = await new Promise<Server>((resolve, reject) => {
    const server = app.listen(config.devFakes.port, config.devFakes.host, () => resolve(server));
    server.once('error', reject);
  });

  return {
    http,
    smtp,
    mailbox,
    idp,
    app,
    close: async () => {
      await new Promise<void>((resolve) => http.close(() => resolve()));
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
    },
  };
}
