import request from 'supertest';
import { Membership } from '../../../server/accounts/membership.model';
import { User } from '../../../server/accounts/user.model';
import { DEMO_PEOPLE, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { Site } from '../../../server/sites/site.model';
import { createTestApp, type TestApp } from '../support/test-app';
import { signInAs } from './support/sign-in';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

const [JR, IF] = DEMO_SITES;
const person = (role: string) => DEMO_PEOPLE.find((candidate) => candidate.role === role) as (typeof DEMO_PEOPLE)[number];

describe('People & sites', () => {
  let testApp: TestApp;
  const tokens: Record<string, string> = {};
  const as = (role: string) => ({ Authorization: `Bearer ${tokens[role]}` });

  beforeAll(async () => {
    testApp = await createTestApp();
    for (const role of ['sampler', 'geologist', 'lab', 'manager', 'admin']) {
      tokens[role] = (await signInAs(testApp.app, role)).accessToken;
    }
  });

  afterAll(() => testApp.close());

  describe('GET /api/people', () => {
    it('lists everyone with role, sites, status and devices, and never a password hash', async () => {
      const response = await request(testApp.app).get('/api/people').set(as('admin')).expect(200);
      expect(response.body.items).toHaveLength(DEMO_PEOPLE.length);
      const sampler = response.body.items.find((item: { email: string }) => item.email === 'sampler@demo.heapsight.test');
      expect(sampler).toEqual(expect.objectContaining({ role: 'sampler', status: 'active', siteIds: [JR.id], devices: [expect.objectContaining({ name: 'Unnamed device' })] }));
      expect(JSON.stringify(response.body)).not.toMatch(/passwordHash|\$2[aby]\$/);
    });
  });

  describe('PATCH /api/people/:id', () => {
    it('changes role and sites, and the person’s next request sees it', async () => {
      const response = await request(testApp.app).patch(`/api/people/${person('sampler').id}`).set(as('admin'))
        .send({ role: 'geologist', siteIds: [JR.id, IF.id] }).expect(200);
      expect(response.body).toEqual(expect.objectContaining({ role: 'geologist', siteIds: [JR.id, IF.id].sort() }));
      const me = await request(testApp.app).get('/api/me').set(as('sampler')).expect(200);
      expect(me.body.role).toBe('geologist');
      await request(testApp.app).patch(`/api/people/${person('sampler').id}`).set(as('admin')).send({ role: 'sampler', siteIds: [JR.id] }).expect(200);
      expect(await Membership.count({ where: { userId: person('sampler').id } })).toBe(1);
    });

    it('disables: the person’s tokens stop at once; enabling lets them sign in again', async () => {
      const signedIn = await signInAs(testApp.app, 'manager');
      await request(testApp.app).patch(`/api/people/${person('manager').id}`).set(as('admin')).send({ isDisabled: true }).expect(200);
      await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${signedIn.accessToken}`).expect(401);
      await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: signedIn.refreshToken }).expect(401);
      await request(testApp.app).patch(`/api/people/${person('manager').id}`).set(as('admin')).send({ isDisabled: false }).expect(200);
      tokens.manager = (await signInAs(testApp.app, 'manager')).accessToken;
    });

    it('refuses to let admins demote or disable themselves', async () => {
      const response = await request(testApp.app).patch(`/api/people/${person('admin').id}`).set(as('admin')).send({ isDisabled: true }).expect(409);
      expect(response.body.error.message).toMatch(/your own account/);
      await request(testApp.app).patch(`/api/people/${person('admin').id}`).set(as('admin')).send({ role: 'manager' }).expect(409);
      expect((await User.findByPk(person('admin').id))?.role).toBe('admin');
    });

    it('refuses bad changes with 400 and changes nothing', async () => {
      const before = await User.findByPk(person('geologist').id);
      for (const body of [{}, { role: 'owner' }, { isDisabled: 'yes' }, { name: 'x'.repeat(201) }, { siteIds: ['JR'] }, { role: 'lab' }, { email: 'new@x.test' }]) {
        const response = await request(testApp.app).patch(`/api/people/${person('geologist').id}`).set(as('admin')).send(body);
        expect({ body, status: response.status }).toEqual({ body, status: 400 });
      }
      await request(testApp.app).patch('/api/people/not-a-uuid').set(as('admin')).send({ name: 'X' }).expect(400);
      await request(testApp.app).patch('/api/people/00000000-0000-4000-8000-000000000000').set(as('admin')).send({ name: 'X' }).expect(404);
      const after = await User.findByPk(person('geologist').id);
      expect(after?.toJSON()).toEqual(before?.toJSON());
    });
  });

  describe('GET /api/sites', () => {
    it('shows each role only the sites it belongs to (admins: all; lab contacts: none)', async () => {
      const codes = async (role: string) => (await request(testApp.app).get('/api/sites').set(as(role)).expect(200)).body.items.map((site: { code: string }) => site.code);
      expect(await codes('sampler')).toEqual(['JR']);
      expect(await codes('geologist')).toEqual(['IF', 'JR']);
      expect(await codes('lab')).toEqual([]);
    });
  });

  describe('GET /api/sites/:id', () => {
    it('refuses a site the user is not a member of with 403', async () => {
      const response = await request(testApp.app).get(`/api/sites/${IF.id}`).set(as('sampler')).expect(403);
      expect(response.body.error.code).toBe('forbidden');
    });

    it('answers 404 for a site that does not exist and 400 for an id that is not one', async () => {
      await request(testApp.app).get('/api/sites/00000000-0000-4000-8000-000000000000').set(as('admin')).expect(404);
      await request(testApp.app).get("/api/sites/1' OR '1'='1").set(as('admin')).expect(400);
    });
  });

  describe('POST /api/sites and PATCH /api/sites/:id', () => {
    it('adds a site with its processing point and default economics, and edits it', async () => {
      const created = await request(testApp.app).post('/api/sites').set(as('admin'))
        .send({ code: 'KB', name: 'Kite Bend', processingLat: -4.1, processingLon: 33.6, economics: { currency: 'USD', goldPricePerTroyOz: 2400, recoveryFraction: 0.55 } })
        .expect(201);
      expect(created.body).toEqual(expect.objectContaining({ code: 'KB', processingLat: -4.1, economics: { currency: 'USD', goldPricePerTroyOz: 2400, recoveryFraction: 0.55 } }));
      const edited = await request(testApp.app).patch(`/api/sites/${created.body.id}`).set(as('admin')).send({ name: 'Kite Bend camp', economics: null }).expect(200);
      expect(edited.body).toEqual(expect.objectContaining({ name: 'Kite Bend camp', code: 'KB', economics: null }));
    });

    it('refuses bad sites with 400 or 409 and stores nothing', async () => {
      const before = await Site.count();
      const refusals: [object, number][] = [
        [{ code: 'JR', name: 'Duplicate' }, 409],
        [{ code: "J'; DROP TABLE sites;--", name: 'Injected' }, 400],
        [{ code: 'ab', name: 'Lower case' }, 400],
        [{ name: 'No code' }, 400],
        [{ code: 'NP', name: 'Half a point', processingLat: -4 }, 400],
        [{ code: 'NP', name: 'Far away', processingLat: 95, processingLon: 0 }, 400],
        [{ code: 'NP', name: 'x'.repeat(201) }, 400],
        [{ code: 'NP', name: 'Bad economics', economics: { recoveryFraction: 55 } }, 400],
        [{ code: 'NP', name: 'Unknown economics', economics: { bribes: 1 } }, 400],
      ];
      for (const [body, status] of refusals) {
        const response = await request(testApp.app).post('/api/sites').set(as('admin')).send(body);
        expect({ body, status: response.status }).toEqual({ body, status });
      }
      expect(await Site.count()).toBe(before);
    });
  });

  describe('PATCH /api/me/device', () => {
    it('renames the device the token was issued to', async () => {
      const response = await request(testApp.app).patch('/api/me/device').set(as('lab')).send({ name: 'Front desk PC' }).expect(200);
      expect(response.body.deviceName).toBe('Front desk PC');
      await request(testApp.app).patch('/api/me/device').set(as('lab')).send({ name: '' }).expect(400);
    });
  });
});
