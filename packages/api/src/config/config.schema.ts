/**
 * Cairn's configuration: one typed, validated object.
 *
 * Sources, later ones winning: config/default.json, config/<profile>.json,
 * config/local.json (git-ignored, per machine), then one CAIRN_* environment
 * variable per key (see `envNameFor`). Secrets are never read from files:
 * they come only from the environment (see `secretsSchema`).
 *
 * Every leaf carries a description of its expected form; a bad value is
 * refused with the key, where it came from, and that expected form.
 */
import { z } from 'zod';

const port = z
  .number()
  .int()
  .min(1)
  .max(65535)
  .describe('a TCP port: a whole number from 1 to 65535');
const host = z.string().min(1).describe('a host name or IP address, e.g. 127.0.0.1');
const positiveInt = (what: string) =>
  z.number().int().positive().describe(`a whole number greater than 0 (${what})`);
const bool = z.boolean().describe('true or false');
const relPath = z.string().min(1).describe('a file or folder path (relative to the checkout)');

const nullableUrl = (what: string) =>
  z
    .url({ protocol: /^https?$/ })
    .nullable()
    .describe(`an absolute http(s) URL (${what}), or null`);
const nullablePath = (what: string) =>
  z.string().min(1).nullable().describe(`a file path relative to the checkout (${what}), or null`);
const attributeName = (what: string) =>
  z
    .string()
    .min(1)
    .describe(
      `the SAML attribute Name that carries ${what}, e.g. an OID such as urn:oid:0.9.2342.19200300.100.1.3`,
    );
const idpValues = (role: string) =>
  z
    .array(z.string().min(1))
    .describe(
      `the role attribute values that mean ${role}, e.g. ["cairn-${role.replace(/ /g, '-')}"]`,
    );

/** Sign-in (SAML 2.0): Cairn as service provider, and where its identity provider is described. */
const authSchema = z
  .object({
    sp: z
      .object({
        entityId: z
          .string()
          .min(1)
          .describe(
            'the service provider entity ID Cairn announces (a URI, e.g. https://cairn.example.org/api/auth/saml/metadata); register it at the identity provider',
          ),
      })
      .strict(),
    idp: z
      .object({
        source: z
          .enum(['dev-fake', 'metadata-url', 'metadata-file', 'settings'])
          .describe(
            'one of: dev-fake (the local fake identity provider, development and tests only), metadata-url, metadata-file, settings (entityId, ssoUrl, sloUrl and certFile below)',
          ),
        metadataUrl: nullableUrl("the identity provider's SAML metadata, for source metadata-url"),
        metadataFile: nullablePath(
          "the identity provider's SAML metadata XML, for source metadata-file",
        ),
        metadataRefreshMinutes: positiveInt(
          'minutes between re-reads of the identity provider metadata',
        ),
        entityId: z
          .string()
          .min(1)
          .nullable()
          .describe("the identity provider's entity ID (its Issuer), for source settings, or null"),
        ssoUrl: nullableUrl(
          "the identity provider's single sign-on URL (HTTP-Redirect binding), for source settings",
        ),
        sloUrl: nullableUrl(
          "the identity provider's single logout URL (HTTP-Redirect binding), for source settings; null when it offers none",
        ),
        certFile: nullablePath(
          "the identity provider's signing certificate (PEM), for source settings",
        ),
      })
      .strict(),
    nameIdFormat: z
      .string()
      .min(1)
      .describe(
        'the NameID format Cairn asks for, e.g. urn:oasis:names:tc:SAML:1.1:nameid-format:emailAddress',
      ),
    attributes: z
      .object({
        email: attributeName('the e-mail address'),
        displayName: attributeName('the display name'),
        role: attributeName("the person's Cairn role"),
        practices: attributeName("the codes of the person's practices (one value per practice)"),
      })
      .strict(),
    roleMapping: z
      .object({
        regional_lead: idpValues('regional lead'),
        practice_lead: idpValues('practice lead'),
        auditor: idpValues('auditor'),
      })
      .strict(),
    trustIdpRoles: bool.describe(
      "true or false: true provisions unknown people and takes role and practices from the identity provider at every sign-in; false lets in only people Cairn already knows, with Cairn's own role and practices",
    ),
    clockSkewSeconds: z
      .number()
      .int()
      .min(0)
      .max(600)
      .describe(
        'a whole number of seconds from 0 to 600: the clock difference tolerated on NotBefore/NotOnOrAfter',
      ),
    requestTtlMinutes: positiveInt(
      'minutes a sign-in request may take before its answer is refused',
    ),
    throttle: z
      .object({
        limit: positiveInt('sign-in requests allowed per window from one address'),
        windowSeconds: positiveInt('seconds'),
      })
      .strict(),
  })
  .strict();

export const configSchema = z
  .object({
    profile: z
      .enum(['development', 'test', 'production'])
      .describe('one of: development, test, production'),
    server: z
      .object({
        host,
        port,
        publicUrl: z
          .url({ protocol: /^https?$/ })
          .describe('an absolute http(s) URL such as http://127.0.0.1:3000'),
        serveWeb: bool,
        trustProxy: bool,
      })
      .strict(),
    database: z
      .object({
        host,
        port,
        name: z
          .string()
          .regex(/^[a-z][a-z0-9_]{0,63}$/)
          .describe('a database name: lower-case letters, digits and _, starting with a letter'),
        user: z
          .string()
          .regex(/^[a-z][a-z0-9_]{0,31}$/)
          .describe('a user name: lower-case letters, digits and _, starting with a letter'),
        poolMax: positiveInt('connections in the pool'),
        connectTimeoutMs: positiveInt('milliseconds'),
        logQueries: bool,
      })
      .strict(),
    mariadb: z
      .object({
        manage: bool.describe('true or false: whether npm start runs a private MariaDB'),
        dataDir: relPath.describe(
          'a folder path (relative to the checkout); the pid file and error log live inside it',
        ),
        socket: z
          .string()
          .describe(
            'a socket file path, or "" for <dataDir>/mariadb.sock (Unix sockets allow about 107 characters)',
          ),
      })
      .strict(),
    session: z
      .object({
        cookieName: z
          .string()
          .regex(/^[A-Za-z0-9._-]+$/)
          .describe('a cookie name: letters, digits, dot, dash, underscore'),
        secureCookie: bool,
        idleTimeoutMinutes: positiveInt('minutes'),
        absoluteTimeoutHours: positiveInt('hours'),
      })
      .strict(),
    auth: authSchema,
    devFakes: z
      .object({
        enabled: bool,
        host,
        port,
        smtpPort: port,
        dataDir: relPath,
      })
      .strict(),
    mail: z
      .object({
        host,
        port,
        secure: bool.describe(
          'true or false: true speaks TLS from the first byte (port 465); false starts plain and upgrades with STARTTLS when the server offers it',
        ),
        requireTls: bool.describe(
          'true or false: true refuses to send unless the server upgrades the connection with STARTTLS',
        ),
        user: z
          .string()
          .min(1)
          .nullable()
          .describe(
            'the SMTP user name, or null to send without signing in (the password comes from CAIRN_MAIL_PASSWORD)',
          ),
        from: z.string().min(3).describe('a sender such as "Cairn <no-reply@example.org>"'),
        connections: z
          .number()
          .int()
          .min(1)
          .max(20)
          .describe(
            'a whole number from 1 to 20: pooled SMTP connections one API process keeps open',
          ),
        timeoutSeconds: positiveInt(
          'seconds an SMTP connection may wait for the server (connecting, greeting, each reply)',
        ),
        outbox: z
          .object({
            concurrency: z
              .number()
              .int()
              .min(0)
              .max(50)
              .describe(
                'a whole number from 0 to 50: messages one API process hands to the server at once (0: this process sends none)',
              ),
            pollIntervalMs: positiveInt('milliseconds between looks for messages due'),
            leaseSeconds: positiveInt(
              'seconds a process holds a message it is sending without renewing; a message held by a crashed process is sent again after this',
            ),
            maxAttempts: positiveInt('attempts at a message before it is marked failed'),
            backoffBaseSeconds: z
              .number()
              .positive()
              .describe(
                'a number of seconds greater than 0: the wait after the first failed attempt, doubled after each further one',
              ),
            backoffMaxSeconds: z
              .number()
              .positive()
              .describe('a number of seconds greater than 0: the longest wait between attempts'),
          })
          .strict(),
        reminders: z
          .object({
            daysBeforeDeadline: z
              .number()
              .int()
              .min(1)
              .max(60)
              .describe(
                'a whole number from 1 to 60: days before a submission deadline that practices without a current submission are reminded',
              ),
            checkCron: z
              .string()
              .regex(/^\S+( \S+){4,5}$/)
              .describe(
                "a cron expression (5 or 6 fields, seconds first when 6) saying when Cairn looks for reminders due, e.g. '0 */15 * * * *'",
              ),
          })
          .strict(),
        digests: z
          .object({
            checkCron: z
              .string()
              .regex(/^\S+( \S+){4,5}$/)
              .describe(
                "a cron expression (5 or 6 fields, seconds first when 6) saying when Cairn sends scheduled digests and schedules those of newly published reports, e.g. '0 * * * * *'",
              ),
            afterPublicationMinutes: z
              .number()
              .int()
              .min(0)
              .max(10080)
              .describe(
                "a whole number from 0 to 10080: minutes after a report's publication that its digests are sent, unless the regional lead moves or cancels the sending",
              ),
          })
          .strict(),
      })
      .strict(),
    extracts: z
      .object({
        maxBytes: positiveInt('bytes'),
        maxRows: positiveInt('data rows'),
        maxUncompressedBytes: positiveInt(
          'bytes an XLSX workbook may expand to when opened; beyond it the file is refused',
        ),
        maxZipEntries: positiveInt('parts an XLSX workbook may have'),
        workers: z
          .number()
          .int()
          .min(0)
          .max(16)
          .describe(
            'a whole number from 0 to 16: extracts one API process reads at once (0: none)',
          ),
        pollIntervalMs: positiveInt('milliseconds between looks for queued extracts'),
        leaseSeconds: positiveInt(
          'seconds a process holds an extract it reads without renewing; a crashed process is noticed after this',
        ),
      })
      .strict(),
    benchmarks: z
      .object({
        pruning: z
          .object({
            enabled: bool,
            intervalMinutes: positiveInt(
              'minutes between prunings; one also runs soon after start',
            ),
            answersUnusedDays: positiveInt(
              'days a stored answer is kept after it was last read (or built, if never read), unless it was built for a quarter’s current result',
            ),
            resultsKeepNewest: positiveInt(
              'stored results of each quarter always kept, newest first, besides the current set’s',
            ),
            resultsGraceMinutes: positiveInt(
              'minutes a stored result is kept after it was built whatever else holds, so that a request that read it finishes',
            ),
            leaseSeconds: positiveInt(
              'seconds one process holds the pruning before another may take it (a crashed process is noticed after this)',
            ),
          })
          .strict(),
      })
      .strict(),
    quarters: z
      .object({
        defaultMeasureSetId: z
          .string()
          .regex(/^[a-z0-9][a-z0-9.-]{0,63}$/)
          .describe("a measure set id such as 'cairn-default-2026.1'"),
        deadlineDaysAfterQuarterEnd: positiveInt(
          'days after the end of a quarter that its submission deadline falls by default',
        ),
      })
      .strict(),
    logging: z
      .object({
        level: z
          .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'])
          .describe('one of: fatal, error, warn, info, debug, trace, silent'),
        requests: bool,
      })
      .strict(),
  })
  .strict();

export type CairnConfig = z.infer<typeof configSchema>;

/**
 * Secrets: environment only. In development `npm start` generates them into
 * .data/secrets.json (git-ignored) and passes them to its child processes.
 */
export const secretsSchema = z.object({
  CAIRN_DATABASE_PASSWORD: z
    .string()
    .min(12)
    .describe('the application database user password, at least 12 characters'),
  CAIRN_SESSION_SECRET: z
    .string()
    .min(32)
    .describe('a random string of at least 32 characters that signs session cookies'),
  CAIRN_PSEUDONYM_SECRET: z
    .string()
    .min(32)
    .describe('a random string of at least 32 characters, the region key for record pseudonyms'),
  CAIRN_MAIL_PASSWORD: z
    .string()
    .min(1)
    .optional()
    .describe('the SMTP password of mail.user (only when mail.user is set)'),
});

export type CairnSecrets = z.infer<typeof secretsSchema>;
export const secretNames = Object.keys(secretsSchema.shape) as (keyof CairnSecrets)[];
/** The secrets every deployment must set (and `npm start` generates for local use). */
export const requiredSecretNames = secretNames.filter(
  (name) => !secretsSchema.shape[name].safeParse(undefined).success,
);
