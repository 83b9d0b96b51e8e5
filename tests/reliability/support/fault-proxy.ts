/**
 * A fault-injecting HTTP proxy on loopback, put between a test's devices and a real server.
 *
 * Each request draws one fate from a seeded generator, so a failing run is repeated exactly by
 * its seed (printed by the tests). The fates are the ones a camp's satellite link deals out:
 * - `pass`: forwarded untouched;
 * - `drop-before`: the connection is cut before the server hears anything;
 * - `drop-after`: the server handles the request in full, then the answer is lost;
 * - `delay`: forwarded after a random wait of at most `maxDelayMs`;
 * - `truncate`: the server's answer is cut off half-way through its body;
 * - `bad-gateway`: a 502 from the "proxy", half the time after the server has already acted.
 * It listens on 127.0.0.1 only and forwards only to the one target it was given.
 */
import { request as httpRequest, createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo, Socket } from 'node:net';

/** What may happen to one request. */
export type Fate = 'pass' | 'drop-before' | 'drop-after' | 'delay' | 'truncate' | 'bad-gateway';

/** Chance of each fault per request; what is left over passes. */
export type FaultRates = Partial<Record<Exclude<Fate, 'pass'>, number>>;

/** A running proxy. `counts` says how often each fate was dealt. */
export interface FaultProxy {
  readonly url: string;
  readonly seed: number;
  readonly counts: Record<Fate, number>;
  /** Faults dealt so far (every fate but `pass`). */
  faultsInjected(): number;
  /** Stops dealing faults (everything passes) or starts again. */
  setFaultsEnabled(isEnabled: boolean): void;
  close(): Promise<void>;
}

/** Mulberry32: a small, fast, seedable generator, ample for choosing fates. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let mixed = Math.imul(state ^ (state >>> 15), 1 | state);
    mixed = (mixed + Math.imul(mixed ^ (mixed >>> 7), 61 | mixed)) ^ mixed;
    return ((mixed ^ (mixed >>> 14)) >>> 0) / 4294967296;
  };
}

const FAULTS: readonly Exclude<Fate, 'pass'>[] = ['drop-before', 'drop-after', 'delay', 'truncate', 'bad-gateway'];

/** Starts a proxy to `target` (an http://127.0.0.1 URL). */
export async function startFaultProxy({ target, seed, rates, maxDelayMs = 200 }: {
  target: string; seed: number; rates: FaultRates; maxDelayMs?: number;
}): Promise<FaultProxy> {
  const upstream = new URL(target);
  if (upstream.hostname !== '127.0.0.1') {
    throw new Error('The fault proxy forwards to loopback only');
  }
  const random = seededRandom(seed);
  const counts: Record<Fate, number> = { pass: 0, 'drop-before': 0, 'drop-after': 0, delay: 0, truncate: 0, 'bad-gateway': 0 };
  let isEnabled = true;
  const sockets = new Set<Socket>();
  const timers = new Set<NodeJS.Timeout>();

  const drawFate = (): Fate => {
    const roll = random();
    let edge = 0;
    for (const fault of FAULTS) {
      edge += rates[fault] ?? 0;
      if (roll < edge) {
        return fault;
      }
    }
    return 'pass';
  };

  /** Sends the request on and hands back the whole answer (status, headers, body). */
  const forward = (incoming: IncomingMessage, body: Buffer) => new Promise<{ status: number; headers: IncomingMessage['headers']; body: Buffer }>((resolve, reject) => {
    const outgoing = httpRequest({
      host: upstream.hostname, port: upstream.port, method: incoming.method, path: incoming.url,
      headers: { ...incoming.headers, host: upstream.host, connection: 'close' },
    }, (answer) => {
      const chunks: Buffer[] = [];
      answer.on('data', (chunk: Buffer) => chunks.push(chunk));
      answer.on('end', () => resolve({ status: answer.statusCode ?? 502, headers: answer.headers, body: Buffer.concat(chunks) }));
      answer.on('error', reject);
    });
    outgoing.on('error', reject);
    outgoing.end(body);
  });

  const cut = (response: ServerResponse) => {
    response.socket?.destroy();
  };

  const handle = async (incoming: IncomingMessage, response: ServerResponse) => {
    const chunks: Buffer[] = [];
    for await (const chunk of incoming) {
      chunks.push(chunk as Buffer);
    }
    const body = Buffer.concat(chunks);
    const fate = isEnabled ? drawFate() : 'pass';
    counts[fate] += 1;
    if (fate === 'drop-before') {
      cut(response);
      return;
    }
    if (fate === 'bad-gateway' && random() < 0.5) {
      response.writeHead(502, { 'content-type': 'text/plain', connection: 'close' }).end('Bad gateway');
      return;
    }
    if (fate === 'delay') {
      const wait = Math.floor(random() * maxDelayMs);
      await new Promise<void>((resolve) => {
        const timer = setTimeout(() => { timers.delete(timer); resolve(); }, wait);
        timers.add(timer);
      });
    }
    const answer = await forward(incoming, body);
    if (fate === 'drop-after') {
      cut(response);
      return;
    }
    if (fate === 'bad-gateway') {
      response.writeHead(502, { 'content-type': 'text/plain', connection: 'close' }).end('Bad gateway');
      return;
    }
    const headers = { ...answer.headers, 'content-length': String(answer.body.length), connection: 'close' };
    delete headers['transfer-encoding'];
    response.writeHead(answer.status, headers);
    if (fate === 'truncate' && answer.body.length > 1) {
      response.write(answer.body.subarray(0, Math.floor(answer.body.length / 2)), () => cut(response));
      return;
    }
    response.end(answer.body);
  };

  const server: Server = createServer((incoming, response) => {
    handle(incoming, response).catch(() => cut(response));
  });
  server.on('connection', (socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    seed,
    counts,
    faultsInjected: () => FAULTS.reduce((sum, fault) => sum + counts[fault], 0),
    setFaultsEnabled(value: boolean) {
      isEnabled = value;
    },
    async close() {
      timers.forEach((timer) => clearTimeout(timer));
      sockets.forEach((socket) => socket.destroy());
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
