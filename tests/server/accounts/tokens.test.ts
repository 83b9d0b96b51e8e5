import jwt from 'jsonwebtoken';
import request from 'supertest';
import { RefreshToken } from '../../../server/accounts/refresh-token.model';
import { TOKEN_AUDIENCE, TOKEN_ISSUER } from '../../../server/accounts/tokens';
import { User } from '../../../server/accounts/user.model';
import { createTestApp, type TestApp } from '../support/test-app';
import { signInAs } from './support/sign-in';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

const base64url = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url');

describe('access tokens', () => {
  let testApp: TestApp;
  let secret: string;

  beforeAll(async () => {
    testApp = await createTestApp();
    secret = testApp.config.jwtSecret as string;
  });

  afterAll(() => testApp.close());

  describe('GET /api/me', () => {
    it('answers the profile for a valid token', async () => {
      const { accessToken, user } = await signInAs(testApp.app, 'geologist');
      const response = await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${accessToken}`).expect(200);
      expect(response.body).toEqual(expect.objectContaining({ id: user.id, email: 'geologist@demo.heapsight.test', role: 'geologist' }));
      expect(response.body.sites.map((site: { code: string }) => site.code)).toEqual(['IF', 'JR']);
    });

    it('answers 401 unauthenticated with no token at all', async () => {
      const response = await request(testApp.app).get('/api/me').expect(401);
      expect(response.body.error).toEqual({ code: 'unauthenticated', message: 'Sign in to continue', details: null });
    });

    it('sees a role change at once, without waiting for the token to expire', async () => {
      const { accessToken, user } = await signInAs(testApp.app, 'manager');
      await User.update({ role: 'geologist' }, { where: { id: user.id } });
      const response = await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${accessToken}`).expect(200);
      expect(response.body.role).toBe('geologist');
      await User.update({ role: 'manager' }, { where: { id: user.id } });
    });
  });

  describe('a token that must be refused', () => {
    let valid: string;
    let payload: jwt.JwtPayload;

    beforeAll(async () => {
      valid = (await signInAs(testApp.app, 'sampler')).accessToken;
      payload = jwt.decode(valid) as jwt.JwtPayload;
    });

    const refusals: [string, () => string, string][] = [
      ['an expired token', () => jwt.sign({ ...payload, iat: Math.floor(Date.now() / 1000) - 3600, exp: Math.floor(Date.now() / 1000) - 60 }, secret, { algorithm: 'HS256' }), 'token_expired'],
      ['a token signed with another key', () => jwt.sign({ ...payload }, 'another-secret-that-is-long-enough-to-sign', { algorithm: 'HS256' }), 'unauthenticated'],
      ['a token with a tampered payload', () => {
        const [header, , signature] = valid.split('.');
        return `${header}.${base64url({ ...payload, sub: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c05' })}.${signature}`;
      }, 'unauthenticated'],
      ['an unsigned token (alg: none)', () => `${base64url({ alg: 'none', typ: 'JWT' })}.${base64url(payload)}.`, 'unauthenticated'],
      ['a token for another audience', () => jwt.sign({ ...payload, aud: 'someone-else' }, secret, { algorithm: 'HS256' }), 'unauthenticated'],
      ['a token signed with HS512', () => jwt.sign({ ...payload }, secret, { algorithm: 'HS512' }), 'unauthenticated'],
      ['a token for a user who does not exist', () => jwt.sign({ ...payload, sub: '00000000-0000-4000-8000-000000000000' }, secret, { algorithm: 'HS256' }), 'unauthenticated'],
      ['a token with no sign-in id', () => jwt.sign({ sub: payload.sub, did: null }, secret, { algorithm: 'HS256', issuer: TOKEN_ISSUER, audience: TOKEN_AUDIENCE, expiresIn: 60 }), 'unauthenticated'],
      ['garbage', () => 'not.a.token', 'unauthenticated'],
    ];

    it.each(refusals)('refuses %s with 401', async (_label, makeToken, code) => {
      const response = await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${makeToken()}`).expect(401);
      expect(response.body.error.code).toBe(code);
      expect(JSON.stringify(response.body)).not.toMatch(/\n\s+at /);
    });

    it('still accepts the untouched token (so the refusals above are about the changes)', async () => {
      await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${valid}`).expect(200);
    });

    it('refuses a token sent as a query parameter instead of the header', async () => {
      await request(testApp.app).get(`/api/sites?access_token=${valid}`).expect(401);
    });

    it('refuses the token of a user who has since been disabled', async () => {
      const { accessToken, user } = await signInAs(testApp.app, 'lab');
      await User.update({ isDisabled: true }, { where: { id: user.id } });
      const response = await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${accessToken}`).expect(401);
      expect(response.body.error.code).toBe('unauthenticated');
      await User.update({ isDisabled: false }, { where: { id: user.id } });
    });
  });
});

describe('POST /api/auth/refresh', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  it('rotates: answers a new pair and the profile, and the new access token works', async () => {
    const first = await signInAs(testApp.app, 'sampler');
    const response = await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: first.refreshToken }).expect(200);
    expect(response.body.refreshToken).not.toBe(first.refreshToken);
    expect(response.body.user.email).toBe('sampler@demo.heapsight.test');
    expect(response.body.user.deviceId).toBe(first.user.deviceId);
    await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${response.body.accessToken}`).expect(200);
  });

  it('chains: each new refresh token refreshes once more', async () => {
    let token = (await signInAs(testApp.app, 'sampler')).refreshToken;
    for (let round = 0; round < 3; round += 1) {
      token = (await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: token }).expect(200)).body.refreshToken;
    }
    expect(token).toMatch(/^[\w-]{43}$/);
  });

  it('treats re-use of a rotated token as theft: refuses it and revokes the whole family', async () => {
    // Arrange: sign in, rotate once; the thief holds the old token, the owner the new pair.
    const stolen = await signInAs(testApp.app, 'geologist');
    const owner = (await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: stolen.refreshToken }).expect(200)).body;

    // Act: the old token comes back.
    const reuse = await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: stolen.refreshToken }).expect(401);

    // Assert: refused, and the owner's newer tokens are dead too (refresh and access).
    expect(reuse.body.error).toEqual(expect.objectContaining({ code: 'unauthenticated', details: { reason: 'reused' } }));
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: owner.refreshToken }).expect(401);
    await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${owner.accessToken}`).expect(401);
    const family = await RefreshToken.findAll({ where: { userId: stolen.user.id, deviceId: stolen.user.deviceId } });
    expect(family.length).toBe(2);
    expect(family.every((row) => row.revokedAt !== null)).toBe(true);
  });

  it('leaves the same person’s other sign-ins alone when one family is revoked', async () => {
    const phone = await signInAs(testApp.app, 'manager');
    const laptop = await signInAs(testApp.app, 'manager');
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: phone.refreshToken }).expect(200);
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: phone.refreshToken }).expect(401);
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: laptop.refreshToken }).expect(200);
  });

  it('refuses an expired refresh token and asks to sign in again', async () => {
    const signedIn = await signInAs(testApp.app, 'lab');
    await RefreshToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: signedIn.user.id } });
    const response = await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: signedIn.refreshToken }).expect(401);
    expect(response.body.error).toEqual(expect.objectContaining({ code: 'unauthenticated', details: { reason: 'expired' } }));
  });

  it('refuses a token it never issued, and bad input, with no new token stored', async () => {
    const before = await RefreshToken.count();
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: 'A'.repeat(43) }).expect(401);
    const wrongType = await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: 12 }).expect(400);
    expect(wrongType.body.error.details[0].path).toBe('refreshToken');
    await request(testApp.app).post('/api/auth/refresh').send({}).expect(400);
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: "' OR 1=1 --" }).expect(400);
    expect(await RefreshToken.count()).toBe(before);
  });

  it('refuses to refresh for a user disabled since signing in', async () => {
    const signedIn = await signInAs(testApp.app, 'admin');
    await User.update({ isDisabled: true }, { where: { id: signedIn.user.id } });
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: signedIn.refreshToken }).expect(401);
    await User.update({ isDisabled: false }, { where: { id: signedIn.user.id } });
  });
});

describe('POST /api/auth/logout', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  it('ends the sign-in: its refresh token and its access token stop working at once', async () => {
    const signedIn = await signInAs(testApp.app, 'sampler');
    await request(testApp.app).post('/api/auth/logout').send({ refreshToken: signedIn.refreshToken }).expect(204);
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: signedIn.refreshToken }).expect(401);
    await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${signedIn.accessToken}`).expect(401);
  });

  it('answers 204 for a token already signed out, and 400 for one that is not a token', async () => {
    const signedIn = await signInAs(testApp.app, 'sampler');
    await request(testApp.app).post('/api/auth/logout').send({ refreshToken: signedIn.refreshToken }).expect(204);
    await request(testApp.app).post('/api/auth/logout').send({ refreshToken: signedIn.refreshToken }).expect(204);
    await request(testApp.app).post('/api/auth/logout').send({ refreshToken: { $ne: null } }).expect(400);
  });
});
