import { randomUUID } from 'node:crypto';
import type { PileData } from '../../shared/sync/protocol';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can, readableSiteIds } from '../accounts/policy';
import { AppError } from '../lib/errors';
import type { SyncService } from '../sync/sync.service';
import { findPile, findPiles, findSamples, type Page, type RecordView, type SampleFilter, type SampleListItem } from './capture.repository';
import { gradesOfPage, type PageGrade } from './page-grades';

/** A row of the Samples screen: the record, its pile's code, and its grade (assay, else calibrated pan estimate). */
export type SampleRowView = SampleListItem & PageGrade;

/** The device id the server writes under when a change comes from the web API rather than a device. */
const WEB_DEVICE_ID = 'web';

/** Reading piles and samples, and editing a pile from the web through the same path as a device's change. */
export class CaptureService {
  constructor(private readonly sync: SyncService) {}

  listPiles(user: CurrentUser, filter: { siteId?: string; limit: number; offset: number }): Promise<Page<RecordView<PileData>>> {
    assertCan(user, 'site:read');
    return findPiles(readableSiteIds(user), filter);
  }

  async getPile(user: CurrentUser, pileId: string): Promise<RecordView<PileData>> {
    assertCan(user, 'site:read');
    const pile = await findPile(pileId);
    if (!pile || !can(user, 'site:read', { siteId: pile.siteId })) {
      throw new AppError('not_found', 'No such pile');
    }
    return pile;
  }

  /**
   * Changes some fields of a pile on top of `baseRevision`, as one mutation through sync: the same
   * checks, the same revision counter, and a kept conflict (409) when someone changed it meanwhile.
   */
  async patchPile(user: CurrentUser, pileId: string, baseRevision: number, changes: Partial<PileData>): Promise<RecordView<PileData>> {
    assertCan(user, 'capture:write');
    const current = await this.getPile(user, pileId);
    const { revision: _revision, updatedAt: _updatedAt, createdById: _createdById, ...data } = current;
    const { results } = await this.sync.push(user, {
      deviceId: user.deviceId ?? WEB_DEVICE_ID,
      mutations: [{ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision, data: { ...data, ...changes, id: pileId } }],
    });
    const [result] = results;
    if (result.status === 'rejected') {
      const isForbidden = result.errors.some((error) => error.path === '');
      throw isForbidden
        ? new AppError('forbidden', 'You do not have permission to change this pile')
        : new AppError('validation_failed', 'The pile is not valid', result.errors);
    }
    if (result.status === 'conflict') {
      throw new AppError('conflict', 'Someone changed this pile since you loaded it; both versions are kept for review', {
        conflictId: result.conflictId, serverRevision: result.revision,
      });
    }
    return this.getPile(user, pileId);
  }

  /** `GET /api/samples`: a page of samples, each graded as the review desk grades it, for that page only. */
  async listSamples(user: CurrentUser, filter: SampleFilter): Promise<Page<SampleRowView>> {
    assertCan(user, 'site:read');
    const { items, total, limit, offset, revision, itemSiteIds } = await findSamples(readableSiteIds(user), filter);
    const grades = await gradesOfPage(items.map((item, index) => ({ id: item.id, siteId: itemSiteIds[index], moisturePct: item.moisturePct })), revision);
    return { items: items.map((item) => ({ ...item, ...(grades.get(item.id) ?? { gradeGpt: null, gradeSource: null }) })), total, limit, offset };
  }
}
