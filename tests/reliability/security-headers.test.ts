import request from 'supertest';
import { createTestApp, type TestApp } from '../server/support/test-app';

/**
 * The headers every answer carries, on success and on refusal alike: the content security policy
 * (no inline or outside script, no framing), no MIME sniffing, no referrer leaks, and no banner
 * naming the framework. JWT tampering, `alg: none`, refresh-token theft and sign-in rate limits are
 * proven in tests/server/accounts (tokens.test.ts, login.test.ts); the role × route × site matrix in
 * tests/server/permissions.
 */
let testApp: TestApp;

beforeAll(async () => {
  testApp = await createTestApp();
});

afterAll(() => testApp.close());

const answers: [string, () => request.Test][] = [
  ['a public success (GET /api/health)', () => request(testApp.app).get('/api/health')],
  ['a refusal for no sign-in (GET /api/me)', () => request(testApp.app).get('/api/me')],
  ['a refusal of malformed JSON (POST /api/auth/login)', () => request(testApp.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":')],
  ['an unknown API path', () => request(testApp.app).get('/api/no-such-route')],
];

describe.each(answers)('%s', (_what, call) => {
  it('carries the security headers and no framework banner', async () => {
    const response = await call();
    const policy = Object.fromEntries(String(response.headers['content-security-policy']).split(';').map((part) => part.trim().split(/\s+/)).map(([name, ...values]) => [name, values]));
    expect(policy['default-src']).toEqual(["'self'"]);
    expect(policy['script-src']).toEqual(["'self'"]);
    expect(policy['object-src']).toEqual(["'none'"]);
    expect(policy['frame-ancestors']).toEqual(["'none'"]);
    expect(policy['base-uri']).toEqual(["'self'"]);
    expect(policy['connect-src']).toEqual(["'self'"]);
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['referrer-policy']).toBe('no-referrer');
    expect(response.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(response.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(response.headers['strict-transport-security']).toMatch(/max-age=\d{7,}/);
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});

describe('an error answer', () => {
  it('never carries a stack trace or a file path', async () => {
    const response = await request(testApp.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(response.status).toBe(400);
    expect(JSON.stringify(response.body)).not.toMatch(/at .+\.(ts|js):\d+|node_modules|\/server\//);
  });
});
