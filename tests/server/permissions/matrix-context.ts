import type { Express } from 'express';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { createAccountLink } from '../../../server/accounts/account-links';
import { createAuthService } from '../../../server/accounts/auth.service';
import { User } from '../../../server/accounts/user.model';
import type { Database } from '../../../server/db/database';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { MailMessage } from '../../../server/mail/mail-message.model';
import { Site } from '../../../server/sites/site.model';
import { ROLES, type Role } from '../../../shared/accounts/roles';
import type { TestApp } from '../support/test-app';

/**
 * What a rule's request builder may use: the app, the database, the demo people and sites, a
 * site nobody (but admins) can read, and helpers that make fresh records for one request.
 */
export interface MatrixContext {
  readonly app: Express;
  readonly database: Database;
  /** The demo sites (`JR`: every demo member; `IF`: all but the sampler) and `outside`: no members. */
  readonly sites: { readonly JR: string; readonly IF: string; readonly outside: string };
  /** The demo person holding each role. */
  readonly people: Record<Role, { readonly id: string; readonly email: string }>;
  /** An access token per role, signed in with a named device. */
  readonly tokens: Record<Role, string>;
  /** The lab name of the demo lab contact, and another lab's. */
  readonly labs: { readonly own: string; readonly other: string };
  /** A string unique within the run, for codes and addresses. */
  unique(): string;
  /** A new person who has accepted their invitation, to change in one request. */
  newPersonId(): Promise<string>;
  /** A new person still holding an invitation (no password yet). */
  newInvitedPersonId(): Promise<string>;
  /** A fresh refresh token of the demo sampler. */
  newRefreshToken(): Promise<string>;
  /** A fresh, unused password link token for a new invited person. */
  newLinkToken(): Promise<string>;
  /** The id of a message in the demo organisation's Outbox. */
  outboxMessageId(): Promise<string>;
}

/** Signs in every demo role and makes the records the rules need. */
export async function createMatrixContext(testApp: TestApp): Promise<MatrixContext> {
  const { app, database, config } = testApp;
  let counter = 0;
  const unique = () => `${Date.now().toString(36)}${(counter += 1)}`.toUpperCase();
  const auth = createAuthService({
    database, jwtSecret: config.jwtSecret as string, publicUrl: 'http://heapsight.test',
    mail: { sendMail: async () => ({ id: randomUUID(), status: 'sent', errorMessage: null }) },
  });

  const outside = randomUUID();
  await database.transaction((transaction) =>
    Site.create({ id: outside, organizationId: DEMO_ORGANIZATION.id, code: 'XS', name: 'Outside every membership', processingLat: null, processingLon: null, economics: null }, { transaction }),
  );

  const people = {} as Record<Role, { id: string; email: string }>;
  const tokens = {} as Record<Role, string>;
  for (const role of ROLES) {
    const person = DEMO_PEOPLE.find((candidate) => candidate.role === role);
    if (!person) {
      throw new Error(`the demo has no ${role}`);
    }
    people[role] = { id: person.id, email: person.email };
    const signedIn = await request(app).post('/api/auth/login').send({ email: person.email, password: DEMO_PASSWORD, deviceId: randomUUID(), deviceName: `${role} device` });
    tokens[role] = signedIn.body.accessToken as string;
  }

  async function createPerson(passwordHash: string | null): Promise<string> {
    const id = randomUUID();
    await database.transaction((transaction) =>
      User.create({ id, organizationId: DEMO_ORGANIZATION.id, email: `${unique().toLowerCase()}@matrix.test`, name: 'Matrix Person', role: 'sampler', labName: null, passwordHash, isDisabled: false }, { transaction }),
    );
    return id;
  }

  return {
    app, database, people, tokens, unique,
    sites: { JR: DEMO_SITES[0].id, IF: DEMO_SITES[1].id, outside },
    labs: { own: 'Kestrel Analytical', other: 'Some Other Assay House' },
    newPersonId: () => createPerson('$2b$10$abcdefghijklmnopqrstuuJ1uJ5mJ6Y8l1Q3uJ1uJ5mJ6Y8l1Q3uJ'),
    newInvitedPersonId: () => createPerson(null),
    newRefreshToken: async () => (await auth.startSessionFor(people.sampler.id)).refreshToken,
    async newLinkToken() {
      const userId = await createPerson(null);
      return database.transaction((transaction) => createAccountLink(userId, 'invitation', new Date(), transaction));
    },
    async outboxMessageId() {
      const id = randomUUID();
      await database.transaction((transaction) =>
        MailMessage.create({ id, organizationId: DEMO_ORGANIZATION.id, recipients: 'someone@matrix.test', subject: 'Matrix', textBody: 'Hello', htmlBody: null, attachments: '[]', status: 'sent', errorMessage: null, transportMessageId: null }, { transaction }),
      );
      return id;
    },
  };
}
