import request from 'supertest';
import { createTestApp, type TestApp } from './support/test-app';

describe('GET /api/health', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp({ withDemo: false });
  });

  afterAll(() => testApp.close());

  it('says the server and its database are up, with the version', async () => {
    const response = await request(testApp.app).get('/api/health').expect(200);
    expect(response.body).toEqual({ status: 'ok', version: expect.stringMatching(/^\d+\.\d+\.\d+/), db: 'ok' });
  });

  it('sends security headers', async () => {
    const response = await request(testApp.app).get('/api/health');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-security-policy']).toContain("script-src 'self'");
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});

describe('an unknown API route', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp({ withDemo: false });
  });

  afterAll(() => testApp.close());

  it('answers 404 in the error format', async () => {
    const response = await request(testApp.app).get('/api/no-such-thing').expect(404);
    expect(response.body).toEqual({ error: { code: 'not_found', message: 'No API route for GET /api/no-such-thing', details: null } });
  });

  it('refuses malformed JSON with 400 and no stack trace', async () => {
    const response = await request(testApp.app)
      .post('/api/health')
      .set('content-type', 'application/json')
      .send('{"broken": ')
      .expect(400);
    expect(response.body.error.code).toBe('bad_request');
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.js/);
  });

  it('refuses a body over the size limit with 413', async () => {
    const response = await request(testApp.app)
      .post('/api/health')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ padding: 'x'.repeat(3 * 1024 * 1024) }))
      .expect(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });
});
