import { randomUUID } from 'node:crypto';
import { UniqueConstraintError } from 'sequelize';
import { makeHumanCode } from '../../shared/sync/human-code';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import { Site } from '../sites/site.model';
import type { SyncService } from '../sync/sync.service';
import { LabelRange } from './label-range.model';

/** The most labels one request prints: ten sheets of 24, enough for a long field week. */
export const MAX_LABELS_PER_REQUEST = 240;

/** The highest sequence a human code can carry (see shared/sync/human-code.ts). */
const MAX_SEQUENCE = 999_999;

/** Two reservations racing on PostgreSQL: the loser retries on the next free run. */
const RESERVE_ATTEMPTS = 5;

/** One printed sheet's worth of codes, reserved on the server. */
export interface ReservedLabels {
  readonly site: { readonly id: string; readonly code: string; readonly name: string };
  readonly deviceNumber: number;
  readonly firstSequence: number;
  readonly lastSequence: number;
  readonly codes: readonly string[];
  readonly printedBy: string;
  readonly printedAt: string;
}

/**
 * Reserves sample codes for printed labels.
 *
 * Why codes never repeat: each site prints its labels under a device number of its own, taken
 * from the same deployment-wide device-number table the phones draw theirs from (device id
 * `labels:<siteId>`). No phone ever counts under that number, so a printed code cannot meet a
 * code a phone made for itself. Within the site's label number, each sheet reserves the next run
 * of sequences in `label_ranges`; the unique (site, first sequence) index refuses a second sheet
 * that raced for the same run, and that request retries on the run after it.
 */
export class LabelsService {
  constructor(
    private readonly database: Database,
    private readonly sync: SyncService,
    private readonly now: () => Date = () => new Date(),
  ) {}

  /** Reserves `count` new codes at a site for a label sheet. */
  async reserve(user: CurrentUser, siteId: string, count: number): Promise<ReservedLabels> {
    assertCan(user, 'capture:write', { siteId });
    const site = await Site.findByPk(siteId);
    if (!site) {
      throw new AppError('not_found', 'No such site');
    }
    const { deviceNumber } = await this.sync.registerDevice(user, `labels:${site.id}`);
    for (let attempt = 1; ; attempt += 1) {
      try {
        const range = await this.database.transaction(async (transaction) => {
          const highest = ((await LabelRange.max('lastSequence', { where: { siteId: site.id }, transaction })) as number | null) ?? 0;
          const firstSequence = highest + 1;
          const lastSequence = highest + count;
          if (lastSequence > MAX_SEQUENCE) {
            throw new AppError('conflict', `This site has used up its label codes (at most ${MAX_SEQUENCE})`);
          }
          return LabelRange.create({ id: randomUUID(), siteId: site.id, deviceNumber, firstSequence, lastSequence, printedById: user.id }, { transaction });
        });
        const codes = Array.from({ length: count }, (_, index) =>
          makeHumanCode({ siteCode: site.code, deviceNumber, sequence: range.firstSequence + index, kind: 'sample' }));
        return {
          site: { id: site.id, code: site.code, name: site.name },
          deviceNumber, firstSequence: range.firstSequence, lastSequence: range.lastSequence, codes,
          printedBy: user.name, printedAt: this.now().toISOString(),
        };
      } catch (error) {
        if (!(error instanceof UniqueConstraintError) || attempt >= RESERVE_ATTEMPTS) {
          throw error;
        }
      }
    }
  }
}
