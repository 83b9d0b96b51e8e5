import request from 'supertest';
import { AccountLink } from '../../../server/accounts/account-link.model';
import { User } from '../../../server/accounts/user.model';
import { DEMO_SITES } from '../../../server/demo/demo-scenario';
import { createTestApp, type TestApp } from '../support/test-app';
import { linkIn, startMailCatcher, type MailCatcher } from './support/mail-catcher';
import { signInAs } from './support/sign-in';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

const NEW_PASSWORD = 'tailings-at-dawn-42';

describe('invitations by e-mail', () => {
  let mail: MailCatcher;
  let testApp: TestApp;
  let adminToken: string;

  beforeAll(async () => {
    mail = await startMailCatcher();
    testApp = await createTestApp({ env: mail.env });
    adminToken = (await signInAs(testApp.app, 'admin')).accessToken;
  });

  afterAll(async () => {
    await testApp.close();
    await mail.stop();
  });

  const invite = (body: object, token = adminToken) =>
    request(testApp.app).post('/api/people/invitations').set('Authorization', `Bearer ${token}`).send(body);

  describe('POST /api/people/invitations, then the link', () => {
    it('creates the person, e-mails a link, and the link sets a password once; then they sign in', async () => {
      // Arrange and act: the admin invites a new sampler for Ironstone Flats.
      const response = await invite({ email: 'Amani@Crew.test', name: 'Amani Sieve', role: 'sampler', siteIds: [DEMO_SITES[1].id] }).expect(201);
      expect(response.body.person).toEqual(expect.objectContaining({ email: 'amani@crew.test', role: 'sampler', status: 'invited', siteIds: [DEMO_SITES[1].id] }));
      expect(response.body.mail.status).toBe('sent');

      // The message reached the SMTP server, with a link to the app.
      const message = await mail.waitForMessageTo('amani@crew.test');
      expect(message.subject).toBe('You are invited to Heapsight');
      expect(message.from?.text).toContain('no-reply@heapsight.invalid');
      const { url, token } = linkIn(message);
      expect(url.startsWith('http://heapsight.test/set-password?token=')).toBe(true);

      // Following the link: the page learns who it is for, then the password is set.
      const info = await request(testApp.app).post('/api/auth/link').send({ token }).expect(200);
      expect(info.body).toEqual(expect.objectContaining({ purpose: 'invitation', email: 'amani@crew.test', name: 'Amani Sieve' }));
      const set = await request(testApp.app).post('/api/auth/password').send({ token, password: NEW_PASSWORD }).expect(200);
      expect(set.body).toEqual({ email: 'amani@crew.test' });

      const signedIn = await request(testApp.app).post('/api/auth/login').send({ email: 'amani@crew.test', password: NEW_PASSWORD }).expect(200);
      expect(signedIn.body.user.sites.map((site: { code: string }) => site.code)).toEqual(['IF']);

      // Single use: the same link is refused the second time and the password stays.
      const again = await request(testApp.app).post('/api/auth/password').send({ token, password: 'someone-else-now-99' }).expect(400);
      expect(again.body.error.message).toBe('This link does not work any more: ask for a new one');
      await request(testApp.app).post('/api/auth/login').send({ email: 'amani@crew.test', password: NEW_PASSWORD }).expect(200);
    });

    it('keeps the link out of the stored copy in Outbox when not in demo mode', async () => {
      await invite({ email: 'hidden@crew.test', name: 'Hidden Link', role: 'geologist', siteIds: [] }).expect(201);
      const { token } = linkIn(await mail.waitForMessageTo('hidden@crew.test'));
      const list = await request(testApp.app).get('/api/outbox').set('Authorization', `Bearer ${adminToken}`).expect(200);
      const stored = list.body.items.find((item: { recipients: string[] }) => item.recipients.includes('hidden@crew.test'));
      const detail = await request(testApp.app).get(`/api/outbox/${stored.id}`).set('Authorization', `Bearer ${adminToken}`).expect(200);
      expect(detail.body.subject).toBe('You are invited to Heapsight');
      expect(detail.body.status).toBe('sent');
      expect(detail.body.textBody).toContain('[hidden: sent by e-mail only]');
      expect(detail.body.textBody).not.toContain(token);
    });

    it('refuses an expired link', async () => {
      await invite({ email: 'late@crew.test', name: 'Late Comer', role: 'manager', siteIds: [] }).expect(201);
      const { token } = linkIn(await mail.waitForMessageTo('late@crew.test'));
      const user = await User.findOne({ where: { email: 'late@crew.test' } });
      await AccountLink.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: user?.id } });
      await request(testApp.app).post('/api/auth/link').send({ token }).expect(400);
      await request(testApp.app).post('/api/auth/password').send({ token, password: NEW_PASSWORD }).expect(400);
      expect((await User.findOne({ where: { email: 'late@crew.test' } }))?.passwordHash).toBeNull();
    });

    it('re-sends: the new link works and the old one stops', async () => {
      const created = await invite({ email: 'twice@crew.test', name: 'Twice Asked', role: 'sampler', siteIds: [] }).expect(201);
      const first = linkIn(await mail.waitForMessageTo('twice@crew.test')).token;
      const count = (await mail.messages()).length;
      await request(testApp.app).post(`/api/people/${created.body.person.id}/invitation`).set('Authorization', `Bearer ${adminToken}`).expect(201);
      const second = linkIn(await mail.waitForMessageTo('twice@crew.test', { after: count })).token;
      expect(second).not.toBe(first);
      await request(testApp.app).post('/api/auth/password').send({ token: first, password: NEW_PASSWORD }).expect(400);
      await request(testApp.app).post('/api/auth/password').send({ token: second, password: NEW_PASSWORD }).expect(200);
      // Accepted: no more invitations for this person.
      await request(testApp.app).post(`/api/people/${created.body.person.id}/invitation`).set('Authorization', `Bearer ${adminToken}`).expect(409);
    });

    it('invites a lab contact only with the name of their lab', async () => {
      const refused = await invite({ email: 'assays@lab.test', name: 'Assay Desk', role: 'lab', siteIds: [] }).expect(400);
      expect(refused.body.error.details).toEqual([{ path: 'labName', message: 'Required for the lab role' }]);
      const created = await invite({ email: 'assays@lab.test', name: 'Assay Desk', role: 'lab', labName: 'Quartz Hill Assays', siteIds: [] }).expect(201);
      expect(created.body.person.labName).toBe('Quartz Hill Assays');
    });
  });

  describe('refusals that change nothing', () => {
    const refusals: [string, object, number][] = [
      ['an address already in use', { email: 'sampler@demo.heapsight.test', name: 'Copy', role: 'sampler', siteIds: [] }, 409],
      ['a missing role', { email: 'a@crew.test', name: 'A', siteIds: [] }, 400],
      ['a role that does not exist', { email: 'a@crew.test', name: 'A', role: 'owner', siteIds: [] }, 400],
      ['a site of no organisation', { email: 'a@crew.test', name: 'A', role: 'sampler', siteIds: ['00000000-0000-4000-8000-000000000000'] }, 400],
      ['sites as a string', { email: 'a@crew.test', name: 'A', role: 'sampler', siteIds: DEMO_SITES[0].id }, 400],
      ['an over-long name', { email: 'a@crew.test', name: 'n'.repeat(201), role: 'sampler', siteIds: [] }, 400],
      ['an SQL-looking address', { email: "a@crew.test'); DROP TABLE users; --", name: 'A', role: 'sampler', siteIds: [] }, 400],
    ];

    it.each(refusals)('refuses %s, with no user and no e-mail made', async (_label, body, status) => {
      const [users, messages] = [await User.count({ paranoid: false }), (await mail.messages()).length];
      const response = await invite(body).expect(status);
      expect(response.body.error.code).toBe(status === 409 ? 'conflict' : 'validation_failed');
      expect(await User.count({ paranoid: false })).toBe(users);
      expect((await mail.messages()).length).toBe(messages);
    });

    it('refuses anyone but an admin with 403', async () => {
      const geologist = (await signInAs(testApp.app, 'geologist')).accessToken;
      const response = await invite({ email: 'b@crew.test', name: 'B', role: 'sampler', siteIds: [] }, geologist).expect(403);
      expect(response.body.error.code).toBe('forbidden');
      expect(await User.findOne({ where: { email: 'b@crew.test' } })).toBeNull();
    });

    it('refuses a weak or over-long new password, leaving the link usable', async () => {
      await invite({ email: 'weak@crew.test', name: 'Weak Choice', role: 'sampler', siteIds: [] }).expect(201);
      const { token } = linkIn(await mail.waitForMessageTo('weak@crew.test'));
      const short = await request(testApp.app).post('/api/auth/password').send({ token, password: 'short' }).expect(400);
      expect(short.body.error.details).toEqual([{ path: 'password', message: 'Use at least 10 characters' }]);
      await request(testApp.app).post('/api/auth/password').send({ token, password: 'é'.repeat(40) }).expect(400);
      await request(testApp.app).post('/api/auth/password').send({ token: 'not-a-token', password: NEW_PASSWORD }).expect(400);
      await request(testApp.app).post('/api/auth/password').send({ token, password: NEW_PASSWORD }).expect(200);
    });
  });
});

describe('invitations when the SMTP server is down', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    // Port 1 on localhost: nothing listens, the connection is refused at once.
    testApp = await createTestApp({ env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: '1' } });
  });

  afterAll(() => testApp.close());

  it('still creates the person and reports the failed e-mail in Outbox, for a re-send later', async () => {
    const admin = (await signInAs(testApp.app, 'admin')).accessToken;
    const response = await request(testApp.app).post('/api/people/invitations').set('Authorization', `Bearer ${admin}`)
      .send({ email: 'offline@crew.test', name: 'No Mail', role: 'sampler', siteIds: [] }).expect(201);
    expect(response.body.mail).toEqual(expect.objectContaining({ status: 'failed', errorMessage: expect.any(String) }));
    const outbox = await request(testApp.app).get('/api/outbox').set('Authorization', `Bearer ${admin}`).expect(200);
    expect(outbox.body.items[0]).toEqual(expect.objectContaining({ recipients: ['offline@crew.test'], status: 'failed' }));
  });
});
