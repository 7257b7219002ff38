import pg from 'pg';
import { LRUCache } from 'lru-cache';

/** The PostgreSQL channel that says "this studio's library changed" (payload: the studio id). */
const CHANNEL = 'library_changed';
/** The channel that says "who may watch in this studio changed" (a membership or subscription). */
export const ACCESS_CHANNEL = 'access_changed';

/** Tells every process (web servers, worker) that a studio's library changed. */
export async function notifyLibraryChanged(pool: pg.Pool, studioId: string, channel = CHANNEL): Promise<void> {
  await pool.query('select pg_notify($1, $2)', [channel, studioId]);
}

/**
 * What every member of a studio sees alike (a page of the listing, the filter values) is
 * computed once and shared. Entries go when any process announces a change to the studio
 * (LISTEN/NOTIFY, so a publish by the job worker shows at once), and after `ttlMs` at the
 * latest. While the listener is not connected nothing is cached: no stale page can outlive a
 * change nobody heard about.
 */
export class LibraryCache {
  private readonly entries: LRUCache<string, Promise<unknown>>;
  private listener: pg.Client | null = null;
  private listening = false;
  private stopped = false;

  constructor(
    private readonly connection: pg.ClientConfig,
    ttlMs = 15_000,
    /** The notification channel that drops a studio's entries (one cache class serves several uses). */
    private readonly channel = CHANNEL,
  ) {
    this.entries = new LRUCache({ max: 2000, ttl: ttlMs });
  }

  /** The cached value for `studioId` + `key`, or `load()`'s (shared by concurrent callers). */
  get<T>(studioId: string, key: string, load: () => Promise<T>): Promise<T> {
    if (!this.listening) {
      this.listen();
      return load();
    }
    const id = `${studioId}|${key}`;
    const hit = this.entries.get(id) as Promise<T> | undefined;
    if (hit) return hit;
    const value = load();
    this.entries.set(id, value);
    value.catch(() => this.entries.delete(id));
    return value;
  }

  /** Drops a studio's entries in this process (others hear of it through the notification). */
  forget(studioId: string) {
    for (const id of this.entries.keys()) if (id.startsWith(`${studioId}|`)) this.entries.delete(id);
  }

  async stop() {
    this.stopped = true;
    this.listening = false;
    this.entries.clear();
    await this.listener?.end().catch(() => {});
  }

  private listen() {
    if (this.listener || this.stopped) return;
    const client = new pg.Client(this.connection);
    this.listener = client;
    const lost = () => {
      if (this.listener !== client) return;
      this.listening = false;
      this.listener = null;
      this.entries.clear();
      client.end().catch(() => {});
    };
    client.on('notification', (msg) => {
      if (msg.channel === this.channel && msg.payload) this.forget(msg.payload);
    });
    client.on('error', lost);
    client.on('end', lost);
    client
      .connect()
      .then(() => client.query(`listen ${this.channel}`))
      .then(() => {
        if (this.listener === client) this.listening = true;
      })
      .catch(lost);
  }
}
