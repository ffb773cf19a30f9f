/**
 * The outbox's decisions that need no database, each tested with a table of
 * cases (outbox-policy.spec.ts): how long to wait before the next attempt,
 * whether a failed attempt is worth another, what to record of the server's
 * reply, and the Message-ID of a row.
 */

/** A message's states: queued → sending → sent, or failed (see outbox.repository.ts). */
export const OUTBOX_STATES = ['queued', 'sending', 'sent', 'failed'] as const;
export type OutboxState = (typeof OUTBOX_STATES)[number];

export interface BackoffSettings {
  backoffBaseSeconds: number;
  backoffMaxSeconds: number;
}

/**
 * Milliseconds to wait after failed attempt number `attempt` (1 = the first):
 * base × 2^(attempt − 1), at most the maximum, less up to a fifth at random so
 * that messages failed together do not all come back together ("full jitter"
 * narrowed to 20 %; common practice).
 */
export function backoffMs(
  attempt: number,
  settings: BackoffSettings,
  random = Math.random,
): number {
  const exponent = Math.max(0, Math.min(attempt - 1, 30));
  const full = Math.min(settings.backoffBaseSeconds * 2 ** exponent, settings.backoffMaxSeconds);
  return Math.round(full * 1000 * (1 - 0.2 * random()));
}

/** What Cairn makes of a failed attempt. */
export interface AttemptFailure {
  /** permanent: the server refused this message for good (5xx); transient: try again later */
  kind: 'permanent' | 'transient';
  /** The server's reply as it gave it, or what went wrong on the way */
  error: string;
  /** The SMTP reply code, when the server answered */
  replyCode: number | null;
}

interface MailError {
  code?: string;
  responseCode?: number;
  response?: string;
  message?: string;
}

/** Connection-level failures: the server could not be reached or went away. */
const NETWORK_CODES = new Set([
  'ECONNECTION',
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'ESOCKET',
  'EDNS',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'ETLS',
  'EAUTH',
  'EPROTOCOL',
  'ENOENT',
]);

/**
 * Sorts a failed send. RFC 5321 §4.2.1: a 5yz reply is a permanent negative
 * completion (sending the same message again will fail again); a 4yz reply is
 * transient. No reply at all (refused connection, time-out, broken socket,
 * refused sign-in) is transient: the server may be back later.
 */
export function classifyFailure(error: unknown): AttemptFailure {
  const e = (error ?? {}) as MailError;
  const replyCode =
    typeof e.responseCode === 'number' && e.responseCode >= 200 && e.responseCode < 600
      ? e.responseCode
      : null;
  const text = clip(
    (e.response && e.response.trim()) || e.message || String(error) || 'unknown error',
    1000,
  );
  if (replyCode !== null && replyCode >= 500 && e.code !== 'EAUTH')
    return { kind: 'permanent', error: text, replyCode };
  if (replyCode !== null && replyCode >= 400) return { kind: 'transient', error: text, replyCode };
  if (e.code && NETWORK_CODES.has(e.code)) return { kind: 'transient', error: text, replyCode };
  // Anything else (no reply code, unknown code) is tried again; the attempt limit ends it.
  return { kind: 'transient', error: text, replyCode };
}

export function clip(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

/**
 * The Message-ID of outbox row `id`: derived from the row alone, so that a
 * message sent again after an interrupted attempt carries the same one and a
 * receiver that already has it can recognise the repeat (RFC 5322 §3.6.4).
 * The outbox repository writes the same text in SQL (claim); a test checks both.
 */
export function messageIdFor(id: number, regionId: number, host: string): string {
  return `<outbox-${id}.region-${regionId}@${host}>`;
}

/** The host part of Message-IDs: the public address's host name (unique to a deployment). */
export function messageIdHost(publicUrl: string): string {
  return new URL(publicUrl).hostname.replace(/[^A-Za-z0-9.-]/g, '') || 'cairn.invalid';
}
