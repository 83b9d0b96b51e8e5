import request from 'supertest';
import { DEMO_PASSWORD } from '../../../server/demo/demo-scenario';
import { createTestApp, type TestApp } from '../support/test-app';
import { linkIn, startMailCatcher, type MailCatcher } from './support/mail-catcher';
import { signInAs } from './support/sign-in';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

describe('forgot password', () => {
  let mail: MailCatcher;
  let testApp: TestApp;

  beforeAll(async () => {
    mail = await startMailCatcher();
    testApp = await createTestApp({ env: { ...mail.env, DEMO: '1' } });
  });

  afterAll(async () => {
    await testApp.close();
    await mail.stop();
  });

  it('e-mails a reset link; the new password works, the old one and old sign-ins stop', async () => {
    // Arrange: the geologist is signed in on some device.
    const before = await signInAs(testApp.app, 'geologist');

    // Act: ask for a reset, follow the link, choose a new password.
    const asked = await request(testApp.app).post('/api/auth/password-reset').send({ email: 'geologist@demo.heapsight.test' }).expect(202);
    const message = await mail.waitForMessageTo('geologist@demo.heapsight.test');
    expect(message.subject).toBe('Reset your Heapsight password');
    const { token } = linkIn(message);
    const info = await request(testApp.app).post('/api/auth/link').send({ token }).expect(200);
    await request(testApp.app).post('/api/auth/password').send({ token, password: 'a-brand-new-secret' }).expect(200);

    // Assert
    expect(asked.body.message).toMatch(/If that address has an account/);
    expect(info.body.purpose).toBe('password-reset');
    await request(testApp.app).post('/api/auth/login').send({ email: 'geologist@demo.heapsight.test', password: DEMO_PASSWORD }).expect(401);
    await request(testApp.app).post('/api/auth/login').send({ email: 'geologist@demo.heapsight.test', password: 'a-brand-new-secret' }).expect(200);
    await request(testApp.app).post('/api/auth/refresh').send({ refreshToken: before.refreshToken }).expect(401);
    await request(testApp.app).get('/api/me').set('Authorization', `Bearer ${before.accessToken}`).expect(401);
  });

  it('answers an unknown address exactly as a known one, and sends nothing', async () => {
    const known = await request(testApp.app).post('/api/auth/password-reset').send({ email: 'manager@demo.heapsight.test' }).expect(202);
    await mail.waitForMessageTo('manager@demo.heapsight.test');
    const count = (await mail.messages()).length;
    const unknown = await request(testApp.app).post('/api/auth/password-reset').send({ email: 'stranger@nowhere.test' }).expect(202);
    expect(unknown.body).toEqual(known.body);
    // A message to a known address after the unknown one proves the queue moved on without it.
    await request(testApp.app).post('/api/auth/password-reset').send({ email: 'lab@demo.heapsight.test' }).expect(202);
    await mail.waitForMessageTo('lab@demo.heapsight.test', { after: count });
    const recipients = (await mail.messages()).slice(count).map((message) => message.to && 'text' in message.to ? message.to.text : '');
    expect(recipients).toEqual(['lab@demo.heapsight.test']);
  });

  it('keeps the link in Outbox in demo mode, so the demo can follow it', async () => {
    const admin = (await signInAs(testApp.app, 'admin')).accessToken;
    const count = (await mail.messages()).length;
    await request(testApp.app).post('/api/auth/password-reset').send({ email: 'sampler@demo.heapsight.test' }).expect(202);
    const { token } = linkIn(await mail.waitForMessageTo('sampler@demo.heapsight.test', { after: count }));
    const list = await request(testApp.app).get('/api/outbox?limit=1').set('Authorization', `Bearer ${admin}`).expect(200);
    const detail = await request(testApp.app).get(`/api/outbox/${list.body.items[0].id}`).set('Authorization', `Bearer ${admin}`).expect(200);
    expect(detail.body.textBody).toContain(token);
  });

  it('refuses bad input with 400 and sends nothing', async () => {
    const count = (await mail.messages()).length;
    await request(testApp.app).post('/api/auth/password-reset').send({ email: 'not an address' }).expect(400);
    await request(testApp.app).post('/api/auth/password-reset').send({ email: ['sampler@demo.heapsight.test'] }).expect(400);
    await request(testApp.app).post('/api/auth/password-reset').send({}).expect(400);
    expect((await mail.messages()).length).toBe(count);
  });
});
