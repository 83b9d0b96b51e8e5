import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import { Membership } from '../accounts/membership.model';
import { User } from '../accounts/user.model';
import type { Database } from '../db/database';
import { Organization } from '../sites/organization.model';
import { Site } from '../sites/site.model';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SITES } from './demo-scenario';
import { seedDemoLab } from './seed-demo-lab';
import { seedDemoCapture } from './seed-demo-capture';
import { seedDemoTrialsAndEconomics } from './seed-demo-trials-economics';

/** bcrypt cost for the demo accounts; 10 is the library default and about 70 ms here. */
const DEMO_HASH_ROUNDS = 10;

/**
 * Writes the demo scenario once. Running it again changes nothing: each record has a fixed id and
 * is only created when absent, so a demo that users have edited keeps their edits.
 */
export async function seedDemo(database: Database): Promise<{ isNew: boolean }> {
  const existing = await Organization.findByPk(DEMO_ORGANIZATION.id, { paranoid: false });
  if (existing) {
    return { isNew: false };
  }
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, DEMO_HASH_ROUNDS);
  await database.transaction(async (transaction) => {
    await Organization.create(DEMO_ORGANIZATION, { transaction });
    for (const site of DEMO_SITES) {
      await Site.create({ ...site, organizationId: DEMO_ORGANIZATION.id, economics: null }, { transaction });
    }
    for (const person of DEMO_PEOPLE) {
      await User.create(
        {
          id: person.id, organizationId: DEMO_ORGANIZATION.id, email: person.email, name: person.name,
          role: person.role, labName: person.labName, passwordHash, isDisabled: false,
        },
        { transaction },
      );
      for (const code of person.siteCodes) {
        const site = DEMO_SITES.find((candidate) => candidate.code === code);
        if (site) {
          await Membership.create({ id: randomUUID(), userId: person.id, siteId: site.id }, { transaction });
        }
      }
    }
  });
  await seedDemoCapture(database);
  await seedDemoLab(database);
  await seedDemoTrialsAndEconomics(database);
  return { isNew: true };
}
