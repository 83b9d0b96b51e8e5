import { z } from 'zod';
import { TRIAL_STATUSES, type TrialStatus } from './trial.model';

const mass = (what: string) => z.number({ error: `${what} must be a number` }).gt(0, `${what} must be above zero`).max(1_000_000_000, `${what} is implausibly large`);
const grade = (what: string) => z.number({ error: `${what} must be a number` }).min(0, `${what} must not be negative`).max(1_000_000, `${what} cannot exceed 1,000,000 g/t`);

/** A new trial as the API takes it (DESIGN §6 names; masses in kg, grades in g/t). */
export const trialInputSchema = z
  .strictObject({
    siteId: z.uuid('the site is named by its id'),
    pileIds: z.array(z.uuid('each pile is named by its id')).min(1, 'name the pile or piles fed').max(50, 'at most 50 piles in one trial'),
    trialDate: z.iso.date('the date of the run is YYYY-MM-DD'),
    equipmentNote: z.string().max(2000, 'the equipment note is at most 2000 characters').default(''),
    feedMassKg: mass('the feed mass'),
    feedGradeGpt: grade('the feed grade').gt(0, 'the feed grade must be above zero'),
    concentrateMassKg: mass('the concentrate mass'),
    concentrateGradeGpt: grade('the concentrate grade'),
    tailingsGradeGpt: grade('the tailings grade'),
    middlingsMassKg: mass('the middlings mass').nullable().default(null),
    middlingsGradeGpt: grade('the middlings grade').nullable().default(null),
    status: z.enum(TRIAL_STATUSES as [TrialStatus, ...TrialStatus[]]).default('accepted'),
  })
  .superRefine((trial, context) => {
    if ((trial.middlingsMassKg === null) !== (trial.middlingsGradeGpt === null)) {
      context.addIssue({ code: 'custom', path: ['middlingsGradeGpt'], message: 'middlings need both their mass and their grade, or neither' });
    }
    if (trial.middlingsMassKg !== null && trial.concentrateMassKg + trial.middlingsMassKg > trial.feedMassKg) {
      context.addIssue({ code: 'custom', path: ['middlingsMassKg'], message: 'concentrate and middlings together cannot weigh more than the feed' });
    }
  });

/** A new trial after validation. */
export type TrialInput = z.infer<typeof trialInputSchema>;

/** The list query: one site's trials. */
export const trialListQuerySchema = z.strictObject({ site: z.uuid('the site is named by its id') });

/** A status change. */
export const trialStatusSchema = z.strictObject({ status: z.enum(TRIAL_STATUSES as [TrialStatus, ...TrialStatus[]]) });
