import type { Migration } from '../migration';
import { organizationsSitesUsers } from './0001-organizations-sites-users';
import { devicesTokensMail } from './0002-devices-tokens-mail';
import { captureSyncPhotos } from './0003-capture-sync-photos';
import { trialsEconomics } from './0005-trials-economics';
import { reviewDesk } from './0004-review-desk';
import { labLoop } from './0006-lab-loop';
import { readIndexes } from './0007-read-indexes';
import { labelRanges } from './0008-label-ranges';
import { sampleSortIndexes } from './0009-sample-sort-indexes';

/** Every migration, in the order it runs. Append; never edit one that has shipped. */
export const migrations: readonly Migration[] = [organizationsSitesUsers, devicesTokensMail, captureSyncPhotos, labLoop, reviewDesk, trialsEconomics, readIndexes, labelRanges, sampleSortIndexes];
