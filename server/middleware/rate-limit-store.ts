import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { RateLimitRepository } from '../modules/auth/rate-limit.repository';

/** Roughly one increment in this many also clears ended windows. */
const HOUSEKEEPING_EVERY = 200;

/**
 * An express-rate-limit store over the `rate_limit_hits` table: the counters live in
 * PostgreSQL, so N server instances behind a load balancer share one limit. Each limiter gets
 * its own store with its own prefix (the table is shared).
 */
export class PostgresRateLimitStore implements Store {
  /** Keys are counted in the database, not in this process. */
  localKeys = false;
  private windowMs = 60_000;

  constructor(
    private readonly repo: RateLimitRepository,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.repo.get(this.prefix + key);
    return row ? { totalHits: row.hits, resetTime: row.resetAt } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    if (Math.random() * HOUSEKEEPING_EVERY < 1) void this.repo.removeEnded().catch(() => undefined);
    const row = await this.repo.increment(this.prefix + key, this.windowMs);
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  async decrement(key: string) {
    await this.repo.decrement(this.prefix + key);
  }

  async resetKey(key: string) {
    await this.repo.reset(this.prefix + key);
  }
}
