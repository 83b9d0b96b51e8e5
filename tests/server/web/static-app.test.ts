import express from 'express';
import { mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync, mkdirSync } from 'node:fs';
import { get, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import { staticApp } from '../../../server/web/static-app';

/** The body as the client reads it after undoing its Content-Encoding. */
function decoded(response: RawResponse): string {
  const encoding = response.headers['content-encoding'];
  if (encoding === 'br') return brotliDecompressSync(response.body).toString();
  if (encoding === 'gzip') return gunzipSync(response.body).toString();
  return response.body.toString();
}

interface RawResponse {
  readonly status: number;
  readonly headers: IncomingHttpHeaders;
  readonly body: Buffer;
}

/** A GET whose body comes back exactly as sent (no client-side decoding). */
function fetchRaw(server: Server, path: string, headers: Record<string, string> = {}): Promise<RawResponse> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    get({ host: '127.0.0.1', port, path, headers }, (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => resolve({ status: response.statusCode ?? 0, headers: response.headers, body: Buffer.concat(chunks) }));
    }).on('error', reject);
  });
}

const SCRIPT = `export const heapsight = ${JSON.stringify('tailings '.repeat(400))};\n`;
const INDEX = `<!doctype html><html><body><hs-root>${'Opening Heapsight '.repeat(100)}</hs-root></body></html>\n`;

describe('staticApp (the built client as the server sends it)', () => {
  let dir: string;
  let server: Server;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'heapsight-static-'));
    writeFileSync(join(dir, 'index.html'), INDEX);
    writeFileSync(join(dir, 'index.html.br'), brotliCompressSync(INDEX));
    writeFileSync(join(dir, 'index.html.gz'), gzipSync(INDEX));
    writeFileSync(join(dir, 'main-ABCD1234.js'), SCRIPT);
    writeFileSync(join(dir, 'main-ABCD1234.js.br'), brotliCompressSync(SCRIPT));
    writeFileSync(join(dir, 'main-ABCD1234.js.gz'), gzipSync(SCRIPT));
    // A script with a gzip copy only, and one whose copy is older than the file (an earlier build's).
    writeFileSync(join(dir, 'chunk-EFGH5678.js'), SCRIPT);
    writeFileSync(join(dir, 'chunk-EFGH5678.js.gz'), gzipSync(SCRIPT));
    writeFileSync(join(dir, 'chunk-STALE999.js.br'), brotliCompressSync('export const old = 1;'));
    const past = new Date(Date.now() - 60_000);
    utimesSync(join(dir, 'chunk-STALE999.js.br'), past, past);
    writeFileSync(join(dir, 'chunk-STALE999.js'), SCRIPT);
    mkdirSync(join(dir, 'icons'));
    writeFileSync(join(dir, 'icons', 'mark.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
    const app = express();
    app.get('/api/ping', (_request, response) => { response.json({ ok: true }); });
    app.use(staticApp(dir));
    server = await new Promise((resolve) => {
      const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
    });
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
    rmSync(dir, { recursive: true, force: true });
  });

  it('sends the brotli copy of a hashed script to a client that takes brotli, cached for a year', async () => {
    const response = await fetchRaw(server, '/main-ABCD1234.js', { 'Accept-Encoding': 'gzip, deflate, br' });
    expect(response.status).toBe(200);
    expect(response.headers['content-encoding']).toBe('br');
    expect(response.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(response.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(response.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(response.body.equals(readFileSync(join(dir, 'main-ABCD1234.js.br')))).toBe(true);
    expect(brotliDecompressSync(response.body).toString()).toBe(SCRIPT);
  });

  it('sends the gzip copy to a client that takes gzip only, and honours q=0 for brotli', async () => {
    for (const accept of ['gzip', 'br;q=0, gzip']) {
      const response = await fetchRaw(server, '/main-ABCD1234.js', { 'Accept-Encoding': accept });
      expect(response.headers['content-encoding']).toBe('gzip');
      expect(response.headers['vary']).toMatch(/Accept-Encoding/i);
      expect(gunzipSync(response.body).toString()).toBe(SCRIPT);
    }
  });

  it('sends the file as it is to a client that takes no compression, still varying on Accept-Encoding', async () => {
    const response = await fetchRaw(server, '/main-ABCD1234.js', { 'Accept-Encoding': 'identity' });
    expect(response.status).toBe(200);
    expect(response.headers['content-encoding']).toBeUndefined();
    expect(response.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(response.body.toString()).toBe(SCRIPT);
  });

  it('falls back to the copy there is (gzip) when brotli is asked for but not built', async () => {
    const response = await fetchRaw(server, '/chunk-EFGH5678.js', { 'Accept-Encoding': 'br, gzip' });
    expect(response.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(response.body).toString()).toBe(SCRIPT);
  });

  it('ignores a copy older than its file (left from an earlier build) and sends the file itself', async () => {
    for (const accept of ['br', 'identity']) {
      const response = await fetchRaw(server, '/chunk-STALE999.js', { 'Accept-Encoding': accept });
      expect(response.status).toBe(200);
      expect(decoded(response)).toBe(SCRIPT);
    }
  });

  it('sends client routes the precompressed index.html with no-cache, so a new version is seen at once', async () => {
    const response = await fetchRaw(server, '/capture', { 'Accept-Encoding': 'gzip, br' });
    expect(response.status).toBe(200);
    expect(response.headers['content-encoding']).toBe('br');
    expect(response.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(response.headers['cache-control']).toBe('no-cache');
    expect(response.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(brotliDecompressSync(response.body).toString()).toBe(INDEX);
    const direct = await fetchRaw(server, '/index.html', { 'Accept-Encoding': 'gzip' });
    expect(direct.headers['cache-control']).toBe('no-cache');
    expect(gunzipSync(direct.body).toString()).toBe(INDEX);
  });

  it('gives files without a hash in their name an hour of caching', async () => {
    const response = await fetchRaw(server, '/icons/mark.svg');
    expect(response.status).toBe(200);
    expect(response.headers['cache-control']).toBe('public, max-age=3600');
  });

  it('never sends a file from outside the build for a path that climbs out of it', async () => {
    for (const path of ['/%2e%2e/%2e%2e/etc/passwd', '/..%2f..%2fetc%2fpasswd', '/%00.js']) {
      const response = await fetchRaw(server, path, { 'Accept-Encoding': 'br, gzip' });
      expect(decoded(response)).not.toContain('root:');
      expect([200, 400, 403, 404]).toContain(response.status);
    }
  });

  it('leaves the API alone', async () => {
    const response = await fetchRaw(server, '/api/ping', { 'Accept-Encoding': 'br' });
    expect(response.status).toBe(200);
    expect(JSON.parse(response.body.toString())).toEqual({ ok: true });
    const missing = await fetchRaw(server, '/api/none');
    expect(missing.status).toBe(404);
  });
});
