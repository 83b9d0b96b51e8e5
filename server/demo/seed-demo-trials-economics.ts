import { createHash, randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { Pile } from '../capture/pile.model';
import type { Database } from '../db/database';
import { BUILT_IN_ECONOMICS, PARAMETER_NAMES, type EconomicParameters } from '../economics/economics-parameters';
import { EconomicsChange, SiteEconomicsRecord } from '../economics/economics.model';
import { Trial, type TrialStatus } from '../trials/trial.model';
import { DEMO_PEOPLE, DEMO_SITES } from './demo-scenario';

/**
 * The demo's economic parameters and table trials, invented like the rest of the scenario: plausible
 * figures, not quotes. The gold price of 2,400 USD per troy ounce is an invented demo default, not a
 * market price. Each trial has c > f > t; one at Ironstone Flats is left pending because its weighed
 * recovery disagrees with its assays, so the demo shows that warning.
 */
const DEMO_ECONOMICS: Readonly<Record<'JR' | 'IF', EconomicParameters>> = {
  JR: { ...BUILT_IN_ECONOMICS, goldPricePerTroyOz: 2400, haulCostPerTKm: 0.65, roadFactor: 1.35, processingCostPerT: 14, fixedCostPerPile: 300, ownerShareOfGross: 0.3 },
  IF: { ...BUILT_IN_ECONOMICS, goldPricePerTroyOz: 2400, haulCostPerTKm: 0.8, roadFactor: 1.5, processingCostPerT: 16, fixedCostPerPile: 350, ownerShareOfGross: 0.35 },
};

interface DemoTrial {
  readonly name: string;
  readonly trialDate: string;
  readonly equipmentNote: string;
  readonly feedMassKg: number;
  readonly feedGradeGpt: number;
  readonly concentrateMassKg: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly middlingsMassKg: number | null;
  readonly middlingsGradeGpt: number | null;
  readonly status: TrialStatus;
}

const DEMO_TRIALS: Readonly<Record<'JR' | 'IF', readonly DemoTrial[]>> = {
  JR: [
    { name: 'jr-1', trialDate: '2025-04-12', equipmentNote: 'Shaking table, fine deck, 0.8 t/h, wash water 60 L/min', feedMassKg: 800, feedGradeGpt: 2.4, concentrateMassKg: 6.8, concentrateGradeGpt: 175, tailingsGradeGpt: 0.95, middlingsMassKg: 22, middlingsGradeGpt: 3.1, status: 'accepted' },
    { name: 'jr-2', trialDate: '2025-04-19', equipmentNote: 'Shaking table, fine deck, 1 t/h', feedMassKg: 650, feedGradeGpt: 1.8, concentrateMassKg: 5.1, concentrateGradeGpt: 130, tailingsGradeGpt: 0.8, middlingsMassKg: null, middlingsGradeGpt: null, status: 'accepted' },
  ],
  IF: [
    { name: 'if-1', trialDate: '2025-05-03', equipmentNote: 'Centrifugal concentrator, 60 G, then table clean-up', feedMassKg: 500, feedGradeGpt: 3.1, concentrateMassKg: 4.6, concentrateGradeGpt: 210, tailingsGradeGpt: 1.2, middlingsMassKg: null, middlingsGradeGpt: null, status: 'accepted' },
    { name: 'if-2', trialDate: '2025-05-10', equipmentNote: 'Shaking table, coarse deck; concentrate partly spilled', feedMassKg: 400, feedGradeGpt: 1.2, concentrateMassKg: 2.2, concentrateGradeGpt: 96, tailingsGradeGpt: 0.55, middlingsMassKg: null, middlingsGradeGpt: null, status: 'pending' },
  ],
};

/** A fixed UUID (version 4 layout) from a name, so seeding again finds the same records. */
function demoId(name: string): string {
  const hex = createHash('sha256').update(`heapsight-demo-trials/${name}`).digest('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-4${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

/**
 * Seeds each demo site's economic parameters (with their history) and its trials, once: a record
 * that exists is left as users have changed it. Trials name the site's first demo piles when there
 * are any.
 */
export async function seedDemoTrialsAndEconomics(database: Database): Promise<void> {
  const manager = DEMO_PEOPLE.find((person) => person.role === 'manager');
  if (!manager) {
    return;
  }
  for (const site of DEMO_SITES) {
    const code = site.code as 'JR' | 'IF';
    const piles = await Pile.findAll({ where: { siteId: site.id, deletedAt: null, shapeModel: { [Op.ne]: 'sacks' } }, order: [['code', 'ASC']], limit: 2, attributes: ['id'] });
    await database.transaction(async (transaction) => {
      if (!(await SiteEconomicsRecord.findByPk(site.id, { transaction }))) {
        const parameters = DEMO_ECONOMICS[code];
        await SiteEconomicsRecord.create({ siteId: site.id, parameters, updatedById: manager.id, revision: 1 }, { transaction });
        const changedAt = new Date('2025-04-01T07:00:00.000Z');
        for (const name of PARAMETER_NAMES.filter((candidate) => parameters[candidate] !== BUILT_IN_ECONOMICS[candidate])) {
          await EconomicsChange.create(
            { id: randomUUID(), siteId: site.id, parameter: name, oldValue: BUILT_IN_ECONOMICS[name], newValue: parameters[name], changedById: manager.id, changedByName: manager.name, changedAt },
            { transaction },
          );
        }
      }
      for (const trial of DEMO_TRIALS[code]) {
        const id = demoId(trial.name);
        if (await Trial.findByPk(id, { transaction, paranoid: false })) {
          continue;
        }
        const { name: _name, ...fields } = trial;
        await Trial.create({ id, siteId: site.id, pileIds: piles.map((pile) => pile.id), ...fields, createdById: manager.id, revision: 1 }, { transaction });
      }
    });
  }
}
