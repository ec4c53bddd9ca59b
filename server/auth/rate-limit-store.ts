import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { Db } from '../db/knex';

/**
 * express-rate-limit counters kept in MariaDB (table rate_limit_hits), so that every
 * server process behind a load balancer counts the same failures.
 */
export class KnexRateLimitStore implements Store {
  windowMs = 60_000;
  prefix: string;
  localKeys = false;

  constructor(
    private readonly db: Db,
    prefix: string,
  ) {
    this.prefix = prefix;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private k(key: string) {
    return `${this.prefix}:${key}`.slice(0, 255);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.db('rate_limit_hits').where({ key: this.k(key) }).first();
    if (!row || new Date(row.reset_at).getTime() <= Date.now()) return undefined;
    return { totalHits: row.hits, resetTime: new Date(row.reset_at) };
  }

  async increment(key: string): Promise<IncrementResponse> {
    const k = this.k(key);
    const reset = new Date(Date.now() + this.windowMs);
    // one statement: a new or expired window starts at 1, otherwise the count goes up
    await this.db.raw(
      `INSERT INTO rate_limit_hits (\`key\`, hits, reset_at) VALUES (?, 1, ?)
       ON DUPLICATE KEY UPDATE
         hits = IF(reset_at <= NOW(3), 1, hits + 1),
         reset_at = IF(reset_at <= NOW(3), VALUES(reset_at), reset_at)`,
      [k, reset],
    );
    const row = await this.db('rate_limit_hits').where({ key: k }).first();
    // now and then, sweep windows that ended long ago (addresses that never came back)
    if (Math.random() < 0.01) {
      await this.db('rate_limit_hits').where('reset_at', '<', new Date(Date.now() - 10 * this.windowMs)).delete();
    }
    return { totalHits: Number(row.hits), resetTime: new Date(row.reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.db('rate_limit_hits').where({ key: this.k(key) }).andWhere('hits', '>', 0).decrement('hits', 1);
  }

  async resetKey(key: string): Promise<void> {
    await this.db('rate_limit_hits').where({ key: this.k(key) }).delete();
  }

  async resetAll(): Promise<void> {
    await this.db('rate_limit_hits').where('key', 'like', `${this.prefix}:%`).delete();
  }
}
