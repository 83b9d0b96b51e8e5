import type { Database } from '../db/database';
import { ReferenceStandard } from '../lab/lab.models';
import { DEMO_ORGANIZATION } from './demo-scenario';

/**
 * Invented reference standards for the demo cooperative (codes, values and SDs made up for the
 * demo; no real certified material). `JRM-STD-2.5` is the one the demo field samples name.
 */
export const DEMO_REFERENCE_STANDARDS = [
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f7a01', code: 'JRM-STD-0.6', expectedGpt: 0.61, sdGpt: 0.04, description: 'Low-grade tailings pulp (demo, invented)' },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f7a02', code: 'JRM-STD-2.5', expectedGpt: 2.52, sdGpt: 0.12, description: 'Mill-discharge pulp (demo, invented)' },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f7a03', code: 'JRM-STD-8', expectedGpt: 8.1, sdGpt: 0.35, description: 'Concentrate-grade pulp (demo, invented)' },
] as const;

/** Writes the demo reference standards once; running it again changes nothing. */
export async function seedDemoLab(database: Database): Promise<void> {
  await database.transaction(async (transaction) => {
    for (const standard of DEMO_REFERENCE_STANDARDS) {
      const existing = await ReferenceStandard.findByPk(standard.id, { transaction });
      if (!existing) {
        await ReferenceStandard.create({ ...standard, organizationId: DEMO_ORGANIZATION.id }, { transaction });
      }
    }
  });
}
