import http from 'node:http';
import type { AddressInfo, Socket } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { completeAnswer, pacedLoad, type PacedAnswer } from '../../scripts/lib/paced-client.ts';

// The open-loop load generator of the load bench (scripts/lib/paced-client.ts): its answer parser,
// and whole runs against a local HTTP server. The runs assert counts and statuses only, never
// timings beyond "not negative", so they hold on a slow, loaded machine.

const buf = (s: string) => Buffer.from(s, 'latin1');

describe('completeAnswer', () => {
  it('an answer whose head has not fully arrived is incomplete', () => {
    expect(completeAnswer(buf(''))).toBeNull();
    expect(completeAnswer(buf('HTTP/1.1 200 OK\r\nContent-Length: 0\r\n'))).toBeNull();
  });

  it('a Content-Length body is complete once all its bytes are there, and the answer ends there', () => {
    const head = 'HTTP/1.1 201 Created\r\nContent-Type: text/plain\r\nContent-Length: 5\r\n\r\n';
    expect(completeAnswer(buf(head))).toBeNull();
    expect(completeAnswer(buf(head + 'hell'))).toBeNull();
    expect(completeAnswer(buf(head + 'hello'))).toEqual({ length: head.length + 5, status: 201 });
    // The start of the next answer on the same socket is not part of this one.
    expect(completeAnswer(buf(head + 'helloHTTP/1.1 200 OK\r\n'))).toEqual({ length: head.length + 5, status: 201 });
    // The header name is matched whatever its case; a zero length means the head alone.
    const empty = 'HTTP/1.1 200 OK\r\ncontent-length: 0\r\n\r\n';
    expect(completeAnswer(buf(empty))).toEqual({ length: empty.length, status: 200 });
  });

  it('a chunked body is complete at its last (zero) chunk, and incomplete at every shorter prefix', () => {
    const head = 'HTTP/1.1 200 OK\r\nTransfer-Encoding: chunked\r\n\r\n';
    const one = head + '5\r\nhello\r\n0\r\n\r\n';
    expect(completeAnswer(buf(one))).toEqual({ length: one.length, status: 200 });
    // Several chunks, one of them with a hex size of two digits (0x1a = 26 bytes).
    const several = head + '3\r\nabc\r\n4\r\ndefg\r\n1a\r\nabcdefghijklmnopqrstuvwxyz\r\n0\r\n\r\n';
    expect(completeAnswer(buf(several))).toEqual({ length: several.length, status: 200 });
    for (const whole of [one, several]) {
      for (let n = head.length; n < whole.length; n++) expect(completeAnswer(buf(whole.slice(0, n))), `prefix of ${n} bytes`).toBeNull();
    }
    // Followed by the next answer: only the first is counted.
    expect(completeAnswer(buf(several + 'HTTP/1.1 204 No Content\r\n\r\n'))).toEqual({ length: several.length, status: 200 });
  });

  it('an answer without a body (204) ends with its head', () => {
    const head = 'HTTP/1.1 204 No Content\r\nDate: Mon, 01 Jan 2024 00:00:00 GMT\r\n\r\n';
    expect(completeAnswer(buf(head))).toEqual({ length: head.length, status: 204 });
    expect(completeAnswer(buf(head + 'HTTP/1.1 200 OK\r\n'))).toEqual({ length: head.length, status: 204 });
  });

  it('reads the status code of the status line', () => {
    for (const [line, status] of [
      ['HTTP/1.1 404 Not Found', 404],
      ['HTTP/1.1 503 Service Unavailable', 503],
      ['HTTP/1.1 422 Unprocessable Entity', 422],
    ] as const) {
      expect(completeAnswer(buf(`${line}\r\nContent-Length: 2\r\n\r\n{}`))?.status).toBe(status);
    }
  });
});

interface TestServer {
  port: number;
  server: http.Server;
  /** Connections the server accepted so far. */
  connections(): number;
  /** Bodies of the requests the server received, with their method, path and length header. */
  received: { method?: string; url?: string; contentLength?: string; body: string }[];
}

const servers: http.Server[] = [];

afterEach(async () => {
  for (const s of servers.splice(0)) {
    s.closeAllConnections();
    await new Promise<void>((resolve) => s.close(() => resolve()));
  }
});

/** A node:http server on 127.0.0.1 (a free port) that hands each request with its read body to `handle`. */
async function startServer(handle: (i: number, req: http.IncomingMessage, res: http.ServerResponse) => void): Promise<TestServer> {
  const received: TestServer['received'] = [];
  const server = http.createServer((req, res) => {
    let body = '';
    req.setEncoding('utf8');
    req.on('data', (d: string) => (body += d));
    req.on('end', () => {
      received.push({ method: req.method, url: req.url, contentLength: req.headers['content-length'], body });
      handle((JSON.parse(body) as { i: number }).i, req, res);
    });
  });
  let connections = 0;
  server.on('connection', () => connections++);
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return { port: (server.address() as AddressInfo).port, server, connections: () => connections, received };
}

/** Request i as raw HTTP/1.1 bytes: POST /x with the JSON body {"i": i}. */
const postX = (port: number) => (i: number) => {
  const body = JSON.stringify({ i });
  return { bytes: Buffer.from(`POST /x HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}\r\n\r\n${body}`) };
};

/** Runs pacedLoad and collects the answers by request number. */
async function run({ onAnswer, ...o }: { port: number; rate: number; total: number; connections: number; timeoutMs?: number; onAnswer?: (i: number) => void }) {
  const answers = new Map<number, PacedAnswer[]>();
  let calls = 0;
  const result = await pacedLoad({
    host: '127.0.0.1',
    ...o,
    request: postX(o.port),
    onAnswer: (i, a) => {
      calls++;
      answers.set(i, [...(answers.get(i) ?? []), a]);
      onAnswer?.(i);
    },
  });
  const statuses = Array.from({ length: o.total }, (_, i) => answers.get(i)?.map((a) => a.status));
  return { result, answers, calls, statuses };
}

describe('pacedLoad', () => {
  it('sends every request built by request(i) and reports each answer once with its status', { timeout: 5_000 }, async () => {
    // Three kinds of answer, so the parser is used on what node really sends: a body with
    // Content-Length (200), a chunked body (201) and no body at all (204).
    const statusOf = (i: number) => [200, 201, 204][i % 3];
    const srv = await startServer((i, _req, res) => {
      const status = statusOf(i);
      if (status === 200) res.writeHead(200, { 'Content-Type': 'application/json' }).end(JSON.stringify({ i }));
      else if (status === 201) {
        res.writeHead(201, { 'Content-Type': 'text/plain' });
        res.write('part one, ');
        res.end('part two');
      } else res.writeHead(204).end();
    });
    const total = 30;
    const { result, answers, calls, statuses } = await run({ port: srv.port, rate: 200, total, connections: 4 });
    expect(calls).toBe(total);
    expect(statuses).toEqual(Array.from({ length: total }, (_, i) => [statusOf(i)]));
    for (const [a] of answers.values()) expect(a.latencyMs).toBeGreaterThanOrEqual(0);
    expect(result.seconds).toBeGreaterThan(0);
    // The server got each request once, as built: POST /x with its body and length.
    expect(srv.received.map((r) => (JSON.parse(r.body) as { i: number }).i).sort((a, b) => a - b)).toEqual(Array.from({ length: total }, (_, i) => i));
    for (const r of srv.received) expect(r).toMatchObject({ method: 'POST', url: '/x', contentLength: String(Buffer.byteLength(r.body)) });
    // Over at most the kept-alive sockets asked for.
    expect(srv.connections()).toBeLessThanOrEqual(4);
  });

  it('a request finding every socket busy waits for one, and all are sent in turn', { timeout: 5_000 }, async () => {
    // One socket, answers held 20 ms and a request due every 2 ms: the requests queue up behind
    // the busy socket and must each be sent when it is free again, in the order they were due.
    const srv = await startServer((_i, _req, res) => {
      setTimeout(() => res.writeHead(200).end('ok'), 20);
    });
    const total = 10;
    const order: number[] = [];
    const { calls, statuses } = await run({ port: srv.port, rate: 500, total, connections: 1, onAnswer: (i) => order.push(i) });
    expect(calls).toBe(total);
    expect(statuses).toEqual(Array.from({ length: total }, () => [200]));
    expect(order).toEqual(Array.from({ length: total }, (_, i) => i));
    expect(srv.connections()).toBe(1);
  });

  it('keeps going when the server closes idle kept-alive sockets during a pause in the load', { timeout: 5_000 }, async () => {
    // The bench once hung here: the server closes a kept-alive socket that sat idle past its
    // keep-alive timeout, and the generator must drop it and open another instead of waiting
    // for ever. node 20 waits keepAliveTimeout + a fixed 1 s before closing such a socket, too
    // long for a quick test, so the server here closes each socket itself 100 ms after its
    // last answer, as the keep-alive timeout does (socket.destroy()). A request is due every
    // 250 ms, so each used socket is closed before the next request is due. Request 1 is held
    // a while, so it and request 2 use two different sockets that then both sit idle. No
    // timeoutMs is given: the default (10 s) is longer than this test's timeout, so a request
    // left waiting on a closed socket, or never sent, fails the test.
    const idle = new Map<Socket, NodeJS.Timeout>();
    const srv = await startServer((i, req, res) => {
      res.once('finish', () => idle.set(req.socket, setTimeout(() => req.socket.destroy(), 100)));
      if (i === 1) setTimeout(() => res.writeHead(200).end('late'), 300);
      else res.writeHead(200).end('ok');
    });
    // A socket that receives its next request in time is not closed.
    srv.server.on('request', (req: http.IncomingMessage) => clearTimeout(idle.get(req.socket)));
    const total = 5;
    const { calls, statuses } = await run({ port: srv.port, rate: 4, total, connections: 2 });
    expect(calls).toBe(total);
    expect(statuses.every((s) => s?.length === 1)).toBe(true);
    // Idle sockets were closed and replaced: more connections than the two of the start.
    expect(srv.connections()).toBeGreaterThan(2);
    // A request racing the close of its socket (possible only on a badly stalled machine) fails
    // with status 0; all others are answered by the server.
    expect(statuses.filter((s) => s?.[0] === 200).length).toBeGreaterThanOrEqual(total - 1);
  });

  it('a request whose socket the server destroys without answering counts as status 0; the others are answered', { timeout: 5_000 }, async () => {
    const dropped = (i: number) => i % 4 === 1;
    const srv = await startServer((i, req, res) => {
      if (dropped(i)) req.socket.destroy();
      else res.writeHead(200).end('ok');
    });
    const total = 12;
    const { calls, statuses } = await run({ port: srv.port, rate: 100, total, connections: 2 });
    expect(calls).toBe(total);
    expect(statuses).toEqual(Array.from({ length: total }, (_, i) => [dropped(i) ? 0 : 200]));
  });

  it('a request unanswered past timeoutMs fails with status 0 and the run still completes', { timeout: 5_000 }, async () => {
    // Request 2 is never answered (the afterEach hook closes its connection at the end).
    const srv = await startServer((i, _req, res) => {
      if (i !== 2) res.writeHead(200).end('ok');
    });
    const total = 6;
    const { calls, statuses } = await run({ port: srv.port, rate: 50, total, connections: 2, timeoutMs: 400 });
    expect(calls).toBe(total);
    expect(statuses).toEqual(Array.from({ length: total }, (_, i) => [i === 2 ? 0 : 200]));
  });
});
