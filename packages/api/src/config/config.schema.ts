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
        secure: bool,
        from: z.string().min(3).describe('a sender such as "Cairn <no-reply@example.org>"'),
      })
      .strict(),
    extracts: z
      .object({
        maxBytes: positiveInt('bytes'),
        maxRows: positiveInt('data rows'),
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
});

export type CairnSecrets = z.infer<typeof secretsSchema>;
export const secretNames = Object.keys(secretsSchema.shape) as (keyof CairnSecrets)[];
