/**
 * The SAML request cache in MariaDB (node-saml's CacheProvider): every
 * AuthnRequest/LogoutRequest id Cairn issues is stored, so that an answer is
 * accepted only for a request Cairn made, only once, only within
 * auth.requestTtlMinutes, and by whichever API process receives it.
 *
 * node-saml calls getAsync before checking signatures and removeAsync when it
 * is done (also on failure), which marks the id used. Two copies of one
 * response arriving at once could both pass getAsync, so the sign-in also
 * `claim`s the id with an atomic UPDATE: only one claim can succeed.
 */
import type { CacheItem, CacheProvider } from '@node-saml/node-saml';
import { QueryTypes, type Sequelize } from 'sequelize';

export type RequestState = 'open' | 'used' | 'expired' | 'unknown';

const maxIdLength = 128;

export class SamlRequestCache implements CacheProvider {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly ttlMinutes: number,
  ) {}

  async saveAsync(key: string, value: string): Promise<CacheItem | null> {
    if (key.length > maxIdLength) throw new Error('SAML request id too long');
    // Rows older than a day are of no further use (not even for telling a replay from an unknown id).
    await this.sequelize.query(
      'DELETE FROM saml_requests WHERE created_at < NOW(3) - INTERVAL 1 DAY',
      { type: QueryTypes.DELETE },
    );
    await this.sequelize.query('INSERT INTO saml_requests (id, created_at) VALUES (?, NOW(3))', {
      replacements: [key],
      type: QueryTypes.INSERT,
    });
    return { value, createdAt: Date.now() };
  }

  /** The request's issue time (ISO string) while it is open and within its TTL, else null. */
  async getAsync(key: string): Promise<string | null> {
    if (!key || key.length > maxIdLength) return null;
    const [row] = await this.sequelize.query<{ created_at: Date }>(
      `SELECT created_at FROM saml_requests
        WHERE id = ? AND used_at IS NULL AND created_at > NOW(3) - INTERVAL ? MINUTE`,
      { replacements: [key, this.ttlMinutes], type: QueryTypes.SELECT },
    );
    return row ? new Date(row.created_at).toISOString() : null;
  }

  /** Marks the request used (node-saml calls this once an answer to it has been processed). */
  async removeAsync(key: string | null): Promise<string | null> {
    if (!key || key.length > maxIdLength) return null;
    await this.sequelize.query(
      'UPDATE saml_requests SET used_at = NOW(3) WHERE id = ? AND used_at IS NULL',
      { replacements: [key], type: QueryTypes.UPDATE },
    );
    return key;
  }

  /** Atomically takes the request for one sign-in; false when another answer already took it. */
  async claim(key: string): Promise<boolean> {
    if (!key || key.length > maxIdLength) return false;
    const [, affected] = (await this.sequelize.query(
      `UPDATE saml_requests SET claimed_at = NOW(3), used_at = COALESCE(used_at, NOW(3))
        WHERE id = ? AND claimed_at IS NULL AND created_at > NOW(3) - INTERVAL ? MINUTE`,
      { replacements: [key, this.ttlMinutes], type: QueryTypes.UPDATE },
    )) as unknown as [unknown, number];
    return affected === 1;
  }

  /** What became of a request id: for telling a replay from an unknown or late answer. */
  async state(key: string | null): Promise<RequestState> {
    if (!key || key.length > maxIdLength) return 'unknown';
    const [row] = await this.sequelize.query<{ used: number; claimed: number; expired: number }>(
      `SELECT (used_at IS NOT NULL) AS used, (claimed_at IS NOT NULL) AS claimed,
              (created_at <= NOW(3) - INTERVAL ? MINUTE) AS expired
         FROM saml_requests WHERE id = ?`,
      { replacements: [this.ttlMinutes, key], type: QueryTypes.SELECT },
    );
    if (!row) return 'unknown';
    // A sign-in went through with it: any later answer is a replay.
    if (Number(row.claimed)) return 'used';
    // node-saml also marks a request used when an answer to it fails; lateness explains more.
    if (Number(row.expired)) return 'expired';
    if (Number(row.used)) return 'used';
    return 'open';
  }
}
