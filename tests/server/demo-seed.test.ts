import { User } from '../../server/accounts/user.model';
import { DEMO_PEOPLE } from '../../server/demo/demo-scenario';
import { seedDemo } from '../../server/demo/seed-demo';
import { Site } from '../../server/sites/site.model';
import { ROLES } from '../../shared/accounts/roles';
import { createTestApp, type TestApp } from './support/test-app';

describe('the demo scenario', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  it('has one demo account for every role', async () => {
    const users = await User.findAll();
    expect(users.map((user) => user.role).sort()).toEqual([...ROLES].sort());
    expect(users.map((user) => user.email).sort()).toEqual(DEMO_PEOPLE.map((person) => person.email).sort());
  });

  it('changes nothing when seeded again', async () => {
    const before = { users: await User.count(), sites: await Site.count() };
    await expect(seedDemo(testApp.database)).resolves.toEqual({ isNew: false });
    expect({ users: await User.count(), sites: await Site.count() }).toEqual(before);
  });
});
