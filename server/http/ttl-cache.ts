/**
 * A small in-process cache whose entries live `ttlMs` milliseconds, for rows every request reads
 * (the session row, the signed-in user). Each instance of the server has its own: a change made
 * through another instance is seen here once the entry expires (docs/scaling.md).
 *
 * A load that was started before an invalidation of its key is not cached when it finishes, so a
 * read racing a write (sign-out, role change) cannot put the old value back for a whole TTL.
 *
 * With a `refresh` function, an entry read after 40–80 % of its TTL (a point drawn per entry, so
 * entries loaded together are not refreshed together) is loaded again in the background while
 * the cached value is still answered (refresh ahead): the rows of signed-in users in use are then
 * never all missing at once — without it, every session of a busy dock expired together every
 * TTL and each was read again by its next request, a burst the load bench saw as a stall every
 * two seconds. A value is still never older than the TTL; a refresh that finds nothing (signed
 * out, deactivated) drops the entry; a failed one leaves it to expire.
 */
export class TtlCache<K, V> {
  private readonly entries = new Map<K, { value: V; until: number; refreshAt: number; refreshing: boolean }>();
  /** Write generation per key; bumped by invalidate(). Dropped with the entries when trimmed. */
  private readonly generations = new Map<K, number>();
  private counter = 0;
  /** Bumped when the generations are dropped, so an old load never matches a new generation. */
  private epoch = 0;

  constructor(
    readonly ttlMs: number,
    private readonly maxEntries = 20_000,
    private readonly refresh?: (key: K) => Promise<V | undefined>,
  ) {}

  /** The fresh value of `key`, or undefined. May start a refresh (see the class comment). */
  get(key: K, now = Date.now()): V | undefined {
    const hit = this.entries.get(key);
    if (!hit) return undefined;
    if (hit.until <= now) {
      this.entries.delete(key);
      return undefined;
    }
    if (this.refresh && !hit.refreshing && now >= hit.refreshAt) {
      hit.refreshing = true;
      this.reload(key, this.refresh);
    }
    return hit.value;
  }

  private reload(key: K, refresh: (key: K) => Promise<V | undefined>): void {
    const ticket = this.ticket(key);
    refresh(key).then(
      (value) => {
        if (value !== undefined) this.set(key, value, ticket);
        else if (ticket.epoch === this.epoch && this.generations.get(key) === ticket.gen) this.entries.delete(key);
      },
      () => {
        // Left to expire; the next load after that reports the error to its request.
      },
    );
  }

  /** A token to pass to `set` after loading `key`; see the class comment. */
  ticket(key: K): { gen: number | undefined; epoch: number } {
    return { gen: this.generations.get(key), epoch: this.epoch };
  }

  /** Keeps a loaded value, unless `key` was invalidated since its ticket was taken. */
  set(key: K, value: V, ticket: { gen: number | undefined; epoch: number }, now = Date.now()): void {
    if (this.ttlMs <= 0 || ticket.epoch !== this.epoch || this.generations.get(key) !== ticket.gen) return;
    if (this.entries.size >= this.maxEntries) this.trim(now);
    this.entries.set(key, { value, until: now + this.ttlMs, refreshAt: now + this.ttlMs * (0.4 + 0.4 * Math.random()), refreshing: false });
  }

  /** Forgets `key` now and refuses loads of it that started before this call. */
  invalidate(key: K): void {
    this.entries.delete(key);
    if (this.generations.size >= this.maxEntries) {
      this.generations.clear();
      this.epoch++;
    }
    this.generations.set(key, ++this.counter);
  }

  clear(): void {
    this.entries.clear();
    this.generations.clear();
    this.epoch++;
  }

  private trim(now: number): void {
    for (const [k, e] of this.entries) if (e.until <= now) this.entries.delete(k);
    // Still full of fresh entries: drop the oldest (a Map iterates in insertion order).
    for (const k of this.entries.keys()) {
      if (this.entries.size < this.maxEntries) break;
      this.entries.delete(k);
    }
  }
}
