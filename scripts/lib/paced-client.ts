/**
 * An open-loop HTTP/1.1 load generator for the load bench (bench-load.ts, the paced phases):
 * request i is due at t0 + i/rate and leaves then, over at most `connections` kept-alive
 * sockets; a request finding them all busy waits for one, and that wait counts. Latency runs
 * from the due time to the last byte of the answer.
 *
 * Written on raw sockets with each request's bytes built up front, as autocannon does, because
 * the load generator shares the two cores with the server and PostgreSQL: node's http client
 * spent ~0.33 ms of CPU per request here, which the server under test then lacked. The answer
 * parser reads what the server sends (status line, Content-Length or chunked body).
 */
import net from 'node:net';

export interface PacedRequest {
  /** The whole request, head and body. */
  bytes: Buffer;
}

export interface PacedAnswer {
  status: number;
  /** ms from the due time to the end of the answer. */
  latencyMs: number;
}

export interface PacedOptions {
  host: string;
  port: number;
  rate: number;
  total: number;
  connections: number;
  /** A request unanswered this long (ms) fails with status 0 and its socket is replaced. */
  timeoutMs?: number;
  /** Builds request i (0-based) when it is due. */
  request(i: number): PacedRequest;
  /** Called once per request, in the order answers come. */
  onAnswer(i: number, a: PacedAnswer): void;
}

interface Conn {
  socket: net.Socket;
  busy: { i: number; due: number; timer: NodeJS.Timeout } | null;
  buf: Buffer;
  dead: boolean;
}

const HEAD_END = Buffer.from('\r\n\r\n');

/** Length of the complete answer at the start of `buf`, with its status, or null if incomplete. */
export function completeAnswer(buf: Buffer): { length: number; status: number } | null {
  const headEnd = buf.indexOf(HEAD_END);
  if (headEnd < 0) return null;
  const head = buf.toString('latin1', 0, headEnd);
  const status = Number(head.slice(9, 12));
  const bodyStart = headEnd + 4;
  const cl = /\r\ncontent-length:\s*(\d+)/i.exec(head);
  if (cl) {
    const length = bodyStart + Number(cl[1]);
    return buf.length >= length ? { length, status } : null;
  }
  if (/\r\ntransfer-encoding:\s*chunked/i.test(head)) {
    let at = bodyStart;
    for (;;) {
      const lineEnd = buf.indexOf('\r\n', at);
      if (lineEnd < 0) return null;
      const size = parseInt(buf.toString('latin1', at, lineEnd), 16);
      if (Number.isNaN(size)) throw new Error('bad chunk size in answer');
      const next = lineEnd + 2 + size + 2;
      if (buf.length < next) return null;
      if (size === 0) return { length: next, status };
      at = next;
    }
  }
  // No body (204, 304) or a body up to the end of the connection (not sent by this server).
  return { length: bodyStart, status };
}

/** Runs the paced load; resolves when every request has its answer (or failed). */
export async function pacedLoad(o: PacedOptions): Promise<{ seconds: number }> {
  const timeoutMs = o.timeoutMs ?? 10_000;
  const pending: { i: number; due: number }[] = [];
  const idle: Conn[] = [];
  let sent = 0;
  let done = 0;
  let finish: () => void = () => {};
  const finished = new Promise<void>((resolve) => (finish = resolve));

  const answer = (i: number, status: number, due: number) => {
    o.onAnswer(i, { status, latencyMs: performance.now() - due });
    if (++done === o.total) finish();
  };

  /** The request waiting on `c` failed (closed, broken, timed out): answered with status 0. */
  const failBusy = (c: Conn) => {
    if (!c.busy) return;
    const { i, due, timer } = c.busy;
    clearTimeout(timer);
    c.busy = null;
    answer(i, 0, due);
  };

  const send = (c: Conn, job: { i: number; due: number }) => {
    const timer = setTimeout(() => {
      failBusy(c);
      c.socket.destroy();
    }, timeoutMs);
    c.busy = { ...job, timer };
    c.socket.write(o.request(job.i).bytes);
  };

  const release = (c: Conn) => {
    if (c.dead) return;
    const job = pending.shift();
    if (job) send(c, job);
    else idle.push(c);
  };

  const open = () =>
    new Promise<Conn>((resolve, reject) => {
      const socket = net.connect({ host: o.host, port: o.port, noDelay: true });
      const c: Conn = { socket, busy: null, buf: Buffer.alloc(0), dead: false };
      socket.once('connect', () => resolve(c));
      socket.on('error', reject);
      socket.once('close', () => {
        // Closed by the server (an idle keep-alive socket) or broken: it leaves the pool; a
        // request waiting on it failed; a new socket takes its place while requests remain.
        c.dead = true;
        const at = idle.indexOf(c);
        if (at >= 0) idle.splice(at, 1);
        failBusy(c);
        if (done < o.total) void open().then(release, () => {});
      });
      socket.on('data', (d: Buffer) => {
        c.buf = c.buf.length ? Buffer.concat([c.buf, d]) : d;
        const got = completeAnswer(c.buf);
        if (!got || !c.busy) return;
        c.buf = c.buf.subarray(got.length);
        const { i, due, timer } = c.busy;
        clearTimeout(timer);
        c.busy = null;
        answer(i, got.status, due);
        release(c);
      });
    });

  for (const c of await Promise.all(Array.from({ length: o.connections }, open))) idle.push(c);

  const t0 = performance.now() + 20;
  const due = (i: number) => t0 + (i * 1000) / o.rate;
  const fire = () => {
    const now = performance.now();
    while (sent < o.total && due(sent) <= now) {
      const job = { i: sent, due: due(sent) };
      sent++;
      const c = idle.pop();
      if (c) send(c, job);
      else pending.push(job);
    }
    if (sent < o.total) setTimeout(fire, Math.max(0, due(sent) - performance.now()));
  };
  setTimeout(fire, 20);
  await finished;
  const seconds = (performance.now() - t0) / 1000;
  done = o.total; // no replacements for sockets closed from here on
  for (const c of idle.splice(0)) c.socket.destroy();
  return { seconds };
}
