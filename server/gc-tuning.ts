import v8 from 'node:v8';

/**
 * Turns off V8's allocation-site pretenuring in a server process. Call once, first thing, in
 * each entry that serves requests (server/index.ts, scripts/start.ts, the load bench's server
 * process scripts/lib/app-process-main.ts).
 *
 * Why: V8 watches how many objects from each place in the code outlive a young-generation
 * collection and, for places where many do, allocates straight in the old generation
 * ("pretenuring"). While the server starts and signs users in, and under a burst of requests, that
 * decision was taken for the places where Node's HTTP server builds each request and answer. From
 * then on every request and answer was born old, and everything they point to that was born young
 * (headers, closures, the reading itself) was kept alive by them through the young collections and
 * copied to the old generation, only to die there. Measured in the load bench at a steady 1 000
 * readings a second (--trace-gc-nvp): a young collection every ~400 ms copying ~2.4 MB and pausing
 * the server 5–14 ms (up to 30 ms); with pretenuring off, ~50 kB and about 2 ms. A small process
 * with the same HTTP code but no such history copied nothing, which is how it was found
 * (docs/scaling.md, "Fourth round"). The matching solver, the one long computation in the server,
 * ran as fast with it off (interleaved runs).
 *
 * V8 reads the flag at each collection, so setting it at run time takes effect (checked with
 * --trace-gc-nvp); Node does not accept it in NODE_OPTIONS.
 */
export function tuneGarbageCollector(): void {
  v8.setFlagsFromString('--no-allocation-site-pretenuring');
}
