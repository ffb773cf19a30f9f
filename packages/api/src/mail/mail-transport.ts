/**
 * Cairn's connection to its mail server: nodemailer over SMTP with a pool of
 * connections kept open (mail.* in the configuration; the password only from
 * CAIRN_MAIL_PASSWORD). One per API process.
 */
import { Inject, Injectable, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import nodemailer, { type SendMailOptions, type Transporter } from 'nodemailer';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CAIRN_SECRETS } from '../config/config.module.js';

export interface SentReply {
  /** The server's reply to the end of the message, e.g. "250 OK: message queued" */
  response: string;
  accepted: string[];
  rejected: string[];
}

/** The nodemailer settings for `mail` (exported for the benchmark's reference sender). */
export function transportOptions(mail: CairnConfig['mail'], password: string | undefined) {
  const timeout = mail.timeoutSeconds * 1000;
  return {
    pool: true as const,
    host: mail.host,
    port: mail.port,
    secure: mail.secure,
    requireTLS: mail.requireTls,
    auth: mail.user ? { user: mail.user, pass: password ?? '' } : undefined,
    maxConnections: mail.connections,
    maxMessages: 500,
    connectionTimeout: timeout,
    greetingTimeout: timeout,
    socketTimeout: timeout,
    disableFileAccess: true,
    disableUrlAccess: true,
  };
}

@Injectable()
export class MailTransport implements OnApplicationShutdown {
  private transporter: Transporter | null = null;

  constructor(
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(CAIRN_SECRETS) private readonly secrets: CairnSecrets,
  ) {}

  private get pool(): Transporter {
    this.transporter ??= nodemailer.createTransport(
      transportOptions(this.config.get('mail', { infer: true }), this.secrets.CAIRN_MAIL_PASSWORD),
    );
    return this.transporter;
  }

  /** Hands one message to the server; resolves with its reply once it is accepted (250). */
  async send(message: SendMailOptions): Promise<SentReply> {
    const info = (await this.pool.sendMail(message)) as {
      response?: string;
      accepted?: (string | { address: string })[];
      rejected?: (string | { address: string })[];
    };
    const address = (a: string | { address: string }) => (typeof a === 'string' ? a : a.address);
    return {
      response: info.response ?? '',
      accepted: (info.accepted ?? []).map(address),
      rejected: (info.rejected ?? []).map(address),
    };
  }

  onApplicationShutdown(): void {
    this.transporter?.close();
    this.transporter = null;
  }
}
