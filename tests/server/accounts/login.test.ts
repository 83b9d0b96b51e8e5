import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { Device } from '../../../server/accounts/device.model';
import { RefreshToken } from '../../../server/accounts/refresh-token.model';
import { User } from '../../../server/accounts/user.model';
import { LOGIN_FAILURES_PER_ACCOUNT, LOGIN_FAILURES_PER_IP } from '../../../server/accounts/rate-limits';
import { DEMO_PASSWORD, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { createTestApp, type TestApp } from '../support/test-app';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

const SAMPLER = 'sampler@demo.heapsight.test';

describe('POST /api/auth/login', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  describe('with the right e-mail and password', () => {
    it('answers an access token, a refresh token and the profile with sites and device', async () => {
      const deviceId = randomUUID();
      const response = await request(testApp.app)
        .post('/api/auth/login')
        .send({ email: '  Sampler@Demo.Heapsight.test ', password: DEMO_PASSWORD, deviceId, deviceName: 'Neema’s phone' })
        .expect(200);

      expect(response.body).toEqual({
        accessToken: expect.stringMatching(/^[\w-]+\.[\w-]+\.[\w-]+$/),
        refreshToken: expect.stringMatching(/^[\w-]{43}$/),
        user: expect.objectContaining({
          email: SAMPLER, role: 'sampler', labName: null, deviceId, deviceName: 'Neema’s phone',
          siteIds: [DEMO_SITES[0].id], sites: [{ id: DEMO_SITES[0].id, code: 'JR', name: 'Jackal Ridge camp' }],
        }),
      });
      expect(response.body.user).not.toHaveProperty('passwordHash');
      const device = await Device.findByPk(deviceId);
      expect(device?.name).toBe('Neema’s phone');
    });

    it('stores only a hash of the refresh token, never the token', async () => {
      const response = await request(testApp.app).post('/api/auth/login').send({ email: SAMPLER, password: DEMO_PASSWORD }).expect(200);
      const rows = await RefreshToken.findAll();
      expect(rows.some((row) => row.tokenHash === response.body.refreshToken)).toBe(false);
      expect(rows.every((row) => /^[0-9a-f]{64}$/.test(row.tokenHash))).toBe(true);
    });

    it('gives a device made without an id one of its own, carried in the token', async () => {
      const response = await request(testApp.app).post('/api/auth/login').send({ email: SAMPLER, password: DEMO_PASSWORD }).expect(200);
      const me = await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${response.body.accessToken}`).expect(200);
      expect(me.body.deviceId).toEqual(expect.stringMatching(/^[0-9a-f-]{36}$/));
      expect(me.body.deviceId).toBe(response.body.user.deviceId);
    });
  });

  describe('with wrong credentials', () => {
    it('answers an unknown e-mail and a wrong password in the same words', async () => {
      const unknown = await request(testApp.app).post('/api/auth/login').send({ email: 'nobody@demo.heapsight.test', password: DEMO_PASSWORD }).expect(401);
      const wrong = await request(testApp.app).post('/api/auth/login').send({ email: 'geologist@demo.heapsight.test', password: 'not-the-password' }).expect(401);
      expect(unknown.body).toEqual(wrong.body);
      expect(unknown.body.error).toEqual({ code: 'unauthenticated', message: 'E-mail or password is wrong', details: null });
    });

    it('refuses a disabled account in the same words', async () => {
      await User.update({ isDisabled: true }, { where: { email: 'manager@demo.heapsight.test' } });
      const response = await request(testApp.app).post('/api/auth/login').send({ email: 'manager@demo.heapsight.test', password: DEMO_PASSWORD }).expect(401);
      expect(response.body.error.message).toBe('E-mail or password is wrong');
      await User.update({ isDisabled: false }, { where: { email: 'manager@demo.heapsight.test' } });
    });
  });

  describe('with bad input', () => {
    const cases: [string, unknown][] = [
      ['a missing password', { email: SAMPLER }],
      ['a missing e-mail', { password: DEMO_PASSWORD }],
      ['a number for the e-mail', { email: 42, password: DEMO_PASSWORD }],
      ['an array for the password', { email: SAMPLER, password: [DEMO_PASSWORD] }],
      ['an over-long e-mail', { email: `${'a'.repeat(250)}@demo.heapsight.test`, password: DEMO_PASSWORD }],
      ['an over-long password', { email: SAMPLER, password: 'p'.repeat(201) }],
      ['an SQL-looking e-mail', { email: "' OR '1'='1' --", password: DEMO_PASSWORD }],
      ['a device id that is not a UUID', { email: SAMPLER, password: DEMO_PASSWORD, deviceId: "1; DROP TABLE devices" }],
      ['an over-long device name', { email: SAMPLER, password: DEMO_PASSWORD, deviceName: 'd'.repeat(101) }],
      ['an unknown field', { email: SAMPLER, password: DEMO_PASSWORD, role: 'admin' }],
    ];

    it.each(cases)('refuses %s with 400 naming the field, and signs nobody in', async (_label, body) => {
      const before = await RefreshToken.count();
      const response = await request(testApp.app).post('/api/auth/login').send(body as object).expect(400);
      expect(response.body.error.code).toBe('validation_failed');
      expect(response.body.error.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: expect.any(String), message: expect.any(String) })]));
      expect(await RefreshToken.count()).toBe(before);
    });

    it('refuses malformed JSON with 400 and no stack trace', async () => {
      const response = await request(testApp.app).post('/api/auth/login').set('content-type', 'application/json').send('{"email": "x@y.test", ').expect(400);
      expect(response.body.error.code).toBe('bad_request');
      expect(JSON.stringify(response.body)).not.toMatch(/\n\s+at /);
    });
  });
});

describe('sign-in rate limits', () => {
  let testApp: TestApp;

  beforeEach(async () => {
    testApp = await createTestApp();
  });

  afterEach(() => testApp.close());

  it(`refuses an account after ${LOGIN_FAILURES_PER_ACCOUNT} failed attempts, even with the right password`, async () => {
    for (let attempt = 0; attempt < LOGIN_FAILURES_PER_ACCOUNT; attempt += 1) {
      await request(testApp.app).post('/api/auth/login').send({ email: SAMPLER, password: `wrong-${attempt}` }).expect(401);
    }
    const refused = await request(testApp.app).post('/api/auth/login').send({ email: SAMPLER, password: DEMO_PASSWORD }).expect(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(refused.body.error.details.retryAfterSeconds).toBeGreaterThan(0);

    // Another account from the same network is not affected.
    await request(testApp.app).post('/api/auth/login').send({ email: 'geologist@demo.heapsight.test', password: DEMO_PASSWORD }).expect(200);
  });

  it('limits the same way for an address with no account, so the limit reveals nothing', async () => {
    for (let attempt = 0; attempt < LOGIN_FAILURES_PER_ACCOUNT; attempt += 1) {
      await request(testApp.app).post('/api/auth/login').send({ email: 'ghost@demo.heapsight.test', password: 'wrong' }).expect(401);
    }
    const refused = await request(testApp.app).post('/api/auth/login').send({ email: 'ghost@demo.heapsight.test', password: 'wrong' }).expect(429);
    expect(refused.body.error.message).toBe('Too many failed sign-ins for this account; wait 15 minutes and try again');
  });

  it(`refuses a network after ${LOGIN_FAILURES_PER_IP} failed attempts across accounts; another network still signs in`, async () => {
    for (let attempt = 0; attempt < LOGIN_FAILURES_PER_IP; attempt += 1) {
      await request(testApp.app).post('/api/auth/login').set('X-Forwarded-For', '203.0.113.7')
        .send({ email: `guess-${attempt}@demo.heapsight.test`, password: 'wrong' }).expect(401);
    }
    const refused = await request(testApp.app).post('/api/auth/login').set('X-Forwarded-For', '203.0.113.7')
      .send({ email: SAMPLER, password: DEMO_PASSWORD }).expect(429);
    expect(refused.body.error.message).toMatch(/this network/);
    await request(testApp.app).post('/api/auth/login').set('X-Forwarded-For', '198.51.100.4')
      .send({ email: SAMPLER, password: DEMO_PASSWORD }).expect(200);
  });
});
