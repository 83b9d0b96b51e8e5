import request from 'supertest';
import { LabBatch } from '../../../server/lab/lab.models';
import { startMailCatcher, type MailCatcher } from '../accounts/support/mail-catcher';
import { createTestApp, type TestApp } from '../support/test-app';
import { batchBody, makeSamples, tokenFor } from './support/lab-fixtures';

let mail: MailCatcher;
let testApp: TestApp;
let geologist: string;

beforeAll(async () => {
  mail = await startMailCatcher();
  testApp = await createTestApp({ env: mail.env });
  geologist = await tokenFor(testApp.app, 'geologist');
});
afterAll(async () => {
  await testApp.close();
  await mail.stop();
});

describe('POST /api/lab-batches/:id/send', () => {
  it('e-mails the lab contact the submission sheet intact, with a summary, and marks the batch dispatched', async () => {
    // Arrange: a batch with QA/QC and its chain of custody filled in.
    const { ids } = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }, { panGpt: 2 }, { panGpt: 3 }]);
    const batch = (await request(testApp.app).post('/api/lab-batches').set('Authorization', `Bearer ${geologist}`)
      .send(batchBody(ids, { blankEvery: 3, standardEvery: 3, standardCodes: ['JRM-STD-2.5'], labContactEmail: 'Assays@Kestrel.lab.test' })).expect(201)).body;
    await request(testApp.app).patch(`/api/lab-batches/${batch.id}/custody`).set('Authorization', `Bearer ${geologist}`)
      .send({ dispatchedBy: 'Tito Rockwell', dispatchedAt: '2026-06-02T07:30:00Z', carrier: 'Camp pick-up, Land Cruiser 3', sealNumbers: 'S-100231, S-100232' }).expect(200);
    const sheet = (await request(testApp.app).get(`/api/lab-batches/${batch.id}/submission.csv`).set('Authorization', `Bearer ${geologist}`).expect(200)).text;

    // Act
    const response = await request(testApp.app).post(`/api/lab-batches/${batch.id}/send`).set('Authorization', `Bearer ${geologist}`).expect(200);

    // Assert: the message as the fake SMTP server received it, parsed with mailparser.
    expect(response.body.mail.status).toBe('sent');
    const message = await mail.waitForMessageTo('assays@kestrel.lab.test');
    expect(message.subject).toBe(`Lab batch ${batch.code}: 5 samples for Fire assay, AAS finish`);
    expect(message.text).toContain('Seal numbers: S-100231, S-100232');
    expect(message.text).toContain('Carrier: Camp pick-up, Land Cruiser 3');
    expect(message.attachments.map((attachment) => [attachment.filename, attachment.contentType])).toEqual([[`${batch.code}-submission.csv`, 'text/csv']]);
    expect(message.attachments[0]?.content.toString('utf8')).toBe(sheet);
    const stored = await LabBatch.findByPk(batch.id);
    expect([stored?.status, stored?.sentAt instanceof Date]).toEqual(['dispatched', true]);

    // The copy in Outbox, for the admin.
    const admin = await tokenFor(testApp.app, 'admin');
    const outbox = (await request(testApp.app).get('/api/outbox').set('Authorization', `Bearer ${admin}`).expect(200)).body.items;
    expect(outbox[0]).toMatchObject({ subject: message.subject, status: 'sent', attachments: [{ filename: `${batch.code}-submission.csv`, sizeBytes: Buffer.byteLength(sheet) }] });
  });

  it('refuses the lab user with 403 and sends nothing', async () => {
    const { ids } = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }]);
    const batch = (await request(testApp.app).post('/api/lab-batches').set('Authorization', `Bearer ${geologist}`).send(batchBody(ids)).expect(201)).body;
    const before = (await mail.messages()).length;
    const lab = await tokenFor(testApp.app, 'lab');

    await request(testApp.app).post(`/api/lab-batches/${batch.id}/send`).set('Authorization', `Bearer ${lab}`).expect(403);

    expect((await mail.messages()).length).toBe(before);
    expect((await LabBatch.findByPk(batch.id))?.status).toBe('draft');
  });
});
