import jwt from 'jsonwebtoken';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { loadCurrentUser } from '../../../server/accounts/accounts.repository';
import { TOKEN_AUDIENCE, TOKEN_ISSUER } from '../../../server/accounts/tokens';
import { openDatabase, type Database } from '../../../server/db/database';
import { DEMO_PEOPLE, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { createTestApp, type TestApp } from '../support/test-app';
import { signInAs } from './support/sign-in';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

const [JR, IF] = DEMO_SITES;
const person = (role: string) => DEMO_PEOPLE.find((candidate) => candidate.role === role) as (typeof DEMO_PEOPLE)[number];
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const sessionOf = (accessToken: string) => (jwt.decode(accessToken) as { sid: string }).sid;

/**
 * Every signed-in request reads its user, memberships and sign-in afresh, so a change written by
 * any server process sharing the database counts on the very next request. Here the changes are
 * written through a second, separate connection to the same database with plain SQL, as another
 * process would write them: nothing in the app's own process hears of them.
 */
describe('a signed-in request sees changes made elsewhere at once', () => {
  let testApp: TestApp;
  let other: Database;
  const write = (sql: string, replacements: Record<string, unknown>) => other.sequelize.query(sql, { replacements });

  beforeAll(async () => {
    testApp = await createTestApp();
    other = await openDatabase(testApp.config);
  });

  afterAll(async () => {
    await other.close();
    await testApp.close();
  });

  it('a disabled user gets 401 on the next request, and the same token works again once enabled', async () => {
    const { accessToken, user } = await signInAs(testApp.app, 'manager');
    await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);

    await write('UPDATE "users" SET "isDisabled" = :disabled WHERE "id" = :id', { disabled: true, id: user.id });
    const refused = await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(401);
    expect(refused.body.error.code).toBe('unauthenticated');
    await request(testApp.app).get('/api/sites').set(bearer(accessToken)).expect(401);

    await write('UPDATE "users" SET "isDisabled" = :disabled WHERE "id" = :id', { disabled: false, id: user.id });
    await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);
  });

  it('a removed membership is gone from the next request: the site is no longer listed nor readable', async () => {
    const { accessToken, user } = await signInAs(testApp.app, 'geologist');
    const before = await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);
    expect(before.body.siteIds).toEqual([JR.id, IF.id].sort());
    await request(testApp.app).get(`/api/sites/${IF.id}`).set(bearer(accessToken)).expect(200);

    await write('DELETE FROM "memberships" WHERE "userId" = :userId AND "siteId" = :siteId', { userId: user.id, siteId: IF.id });
    const after = await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);
    expect(after.body.siteIds).toEqual([JR.id]);
    expect(after.body.sites.map((site: { code: string }) => site.code)).toEqual([JR.code]);
    const sites = await request(testApp.app).get('/api/sites').set(bearer(accessToken)).expect(200);
    expect(JSON.stringify(sites.body)).not.toContain(IF.id);
    await request(testApp.app).get(`/api/sites/${IF.id}`).set(bearer(accessToken)).expect(403);

    // Given back, it is seen again on the next request.
    const at = new Date();
    await write('INSERT INTO "memberships" ("id", "userId", "siteId", "createdAt", "updatedAt") VALUES (:id, :userId, :siteId, :at, :at)',
      { id: randomUUID(), userId: user.id, siteId: IF.id, at });
    await request(testApp.app).get(`/api/sites/${IF.id}`).set(bearer(accessToken)).expect(200);
  });

  it('a changed role counts on the next request', async () => {
    const { accessToken, user } = await signInAs(testApp.app, 'sampler');
    await write('UPDATE "users" SET "role" = :role WHERE "id" = :id', { role: 'geologist', id: user.id });
    expect((await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200)).body.role).toBe('geologist');
    await write('UPDATE "users" SET "role" = :role WHERE "id" = :id', { role: 'sampler', id: user.id });
    expect((await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200)).body.role).toBe('sampler');
  });

  it('a revoked sign-in gets 401 on the next request; the same person’s other sign-in goes on', async () => {
    const phone = await signInAs(testApp.app, 'admin');
    const laptop = await signInAs(testApp.app, 'admin');
    await request(testApp.app).get('/api/me').set(bearer(phone.accessToken)).expect(200);

    await write('UPDATE "refresh_tokens" SET "revokedAt" = :at WHERE "familyId" = :familyId', { at: new Date(), familyId: sessionOf(phone.accessToken) });
    const refused = await request(testApp.app).get('/api/me').set(bearer(phone.accessToken)).expect(401);
    expect(refused.body.error).toEqual(expect.objectContaining({ code: 'unauthenticated', message: 'Your sign-in is no longer valid; sign in again' }));
    await request(testApp.app).get('/api/me').set(bearer(laptop.accessToken)).expect(200);
  });

  it('a deleted user gets 401 on the next request', async () => {
    const { accessToken, user } = await signInAs(testApp.app, 'lab');
    await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);
    await write('UPDATE "users" SET "deletedAt" = :at WHERE "id" = :id', { at: new Date(), id: user.id });
    await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(401);
    await write('UPDATE "users" SET "deletedAt" = NULL WHERE "id" = :id', { id: user.id });
    await request(testApp.app).get('/api/me').set(bearer(accessToken)).expect(200);
  });
});

describe('loadCurrentUser', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  it('answers the user, their sites sorted, and the device named by the token', async () => {
    const geologist = person('geologist');
    const deviceId = randomUUID();
    expect(await loadCurrentUser(geologist.id, randomUUID(), deviceId)).toEqual({
      id: geologist.id, organizationId: expect.any(String), email: geologist.email, name: geologist.name, role: 'geologist',
      labName: null, siteIds: [JR.id, IF.id].sort(), deviceId,
    });
  });

  it('answers a user of no site (a lab contact) with no sites', async () => {
    const lab = person('lab');
    expect(await loadCurrentUser(lab.id, randomUUID(), null)).toEqual(expect.objectContaining({ id: lab.id, role: 'lab', labName: lab.labName, siteIds: [], deviceId: null }));
  });

  it('answers null for a user who does not exist, and for ids that are not ids, without asking the database to parse them', async () => {
    expect(await loadCurrentUser(randomUUID(), randomUUID(), null)).toBeNull();
    expect(await loadCurrentUser("' OR 1=1 --", randomUUID(), null)).toBeNull();
    expect(await loadCurrentUser(person('admin').id, 'not-a-sign-in', null)).toBeNull();
  });

  it('refuses with 401, not 500, a correctly signed token whose ids are not ids', async () => {
    const secret = testApp.config.jwtSecret as string;
    const token = jwt.sign({ sid: 'not-a-uuid', did: null }, secret, { algorithm: 'HS256', issuer: TOKEN_ISSUER, audience: TOKEN_AUDIENCE, subject: 'not-a-uuid-either', expiresIn: 60 });
    const response = await request(testApp.app).get('/api/me').set(bearer(token)).expect(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });
});
