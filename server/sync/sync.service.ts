import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { classifyMutation } from '../../shared/sync/classify-mutation';
import {
  parseEntityData, type ConflictView, type DeviceRegistration, type EntityData, type FieldError, type Mutation,
  type MutationResult, type PulledChange, type PullResponse, type PushRequest, type PushResponse,
  type ResolveConflictRequest, type SyncEntity,
} from '../../shared/sync/protocol';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can, readableSiteIds } from '../accounts/policy';
import { panTestStore, pileStore, sampleStore } from '../capture/capture.repository';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import { photoRecordStore } from '../photos/photos.repository';
import { insertRows } from './insert-rows';
import { selectRaw, type RecordStore, type RecordWrite, type StoredRecord } from './record-store';
import { ChangeLogEntry, DeviceNumber, SyncConflict, SyncMutation, SyncRevision } from './sync.models';

/** The store of each synced entity. */
const STORES: { readonly [E in SyncEntity]: RecordStore<E> } = {
  pile: pileStore,
  sample: sampleStore,
  panTest: panTestStore,
  photo: photoRecordStore,
};

/** The order a batch's writes are flushed in, parents before children (foreign keys). */
const WRITE_ORDER: readonly SyncEntity[] = ['pile', 'sample', 'panTest', 'photo'];

/** A record's change-log row moves to its latest revision (one row per record). */
const CHANGE_LOG_UPDATES = ['revision', 'siteId', 'isDeleted', 'updatedAt'];

/** An id PostgreSQL's uuid columns accept (a lookup by anything else fails there, not just finds nothing). */
const UUID_TEXT = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const keyOf = (entity: SyncEntity, id: string) => `${entity}:${id}`;
const forbidden = (message: string): FieldError[] => [{ path: '', message }];

/**
 * What one batch has read and written so far. Records are looked up once per batch (in bulk,
 * before the first mutation), and each applied mutation updates the working set, so later
 * mutations of the same batch see it (a sample after the pile it belongs to).
 */
class BatchState {
  readonly records = new Map<string, StoredRecord | null>();
  readonly codes = new Map<string, string>();
  readonly writes = new Map<SyncEntity, Map<string, RecordWrite>>();
  readonly changes = new Map<string, { entity: SyncEntity; recordId: string; revision: number; siteId: string; isDeleted: boolean }>();
  readonly seenMutationIds = new Set<string>();
  /** The receipts to store, by mutation id (a Map, so a resend inside the batch is found at once). */
  readonly appliedMutations = new Map<string, { mutationId: string; entity: SyncEntity; recordId: string; status: 'applied' | 'conflict'; revision: number | null; conflictId: string | null }>();
  readonly conflicts: Record<string, unknown>[] = [];

  constructor(readonly revision: { value: number }) {}

  record(entity: SyncEntity, id: string): StoredRecord | null {
    return this.records.get(keyOf(entity, id)) ?? null;
  }
}

/** Push, pull and conflicts: the sync flow of DESIGN §5 over one database. */
export class SyncService {
  constructor(
    private readonly database: Database,
    private readonly now: () => Date = () => new Date(),
  ) {}

  /**
   * Applies a batch in one transaction. Each mutation gets its own answer: applied (new revision),
   * duplicate (already applied, same revision as then), conflict (both versions kept), or rejected
   * (reasons given; nothing written). A failure of the database itself rolls the whole batch back
   * and answers 500, and the device sends the same batch again.
   */
  async push(user: CurrentUser, request: PushRequest): Promise<PushResponse> {
    assertCan(user, 'capture:write');
    return this.database.transaction(async (transaction) => {
      const counter = await SyncRevision.findByPk(1, { transaction, lock: transaction.LOCK.UPDATE });
      if (!counter) {
        throw new AppError('internal', 'The revision counter is missing');
      }
      const batch = new BatchState({ value: counter.value });
      const previous = await this.loadBatch(request.mutations, batch, transaction);

      const results: MutationResult[] = [];
      for (const mutation of request.mutations) {
        results.push(await this.applyOne(user, request.deviceId, mutation, batch, previous, transaction));
      }
      await this.flush(user, request.deviceId, batch, transaction);
      if (batch.revision.value !== counter.value) {
        await SyncRevision.update({ value: batch.revision.value }, { where: { id: 1 }, transaction });
      }
      return { results };
    });
  }

  /**
   * The changes after `since` in the user's sites, in revision order, at most `limit`. Each record
   * appears once, at its latest revision, deleted or not; the cursor is the last revision sent.
   */
  async pull(user: CurrentUser, since: number, limit: number): Promise<PullResponse> {
    assertCan(user, 'site:read');
    const readable = readableSiteIds(user);
    const where: Record<string | symbol, unknown> = { revision: { [Op.gt]: since } };
    if (readable !== 'all') {
      where['siteId'] = { [Op.in]: [...readable] };
    }
    // Raw rows (no model instance per entry); revision is BIGINT, text on PostgreSQL.
    const rows = (await selectRaw(ChangeLogEntry, {
      attributes: ['entity', 'recordId', 'revision'], where, order: [['revision', 'ASC']], limit: limit + 1,
    })) as unknown as { entity: SyncEntity; recordId: string; revision: number | string }[];
    const page = rows.slice(0, limit);
    const byEntity = new Map<SyncEntity, string[]>();
    for (const row of page) {
      const ids = byEntity.get(row.entity);
      if (ids) {
        ids.push(row.recordId);
      } else {
        byEntity.set(row.entity, [row.recordId]);
      }
    }
    const records = new Map<string, StoredRecord>();
    for (const [entity, ids] of byEntity) {
      for (const record of (await STORES[entity].findMany(ids)).values()) {
        records.set(keyOf(entity, record.id), record);
      }
    }
    const changes: PulledChange[] = [];
    for (const row of page) {
      const record = records.get(keyOf(row.entity, row.recordId));
      if (record) {
        changes.push({
          entity: row.entity, id: record.id, revision: record.revision, siteId: record.siteId,
          deletedAt: record.deletedAt ? record.deletedAt.toISOString() : null, data: record.data,
        });
      }
    }
    return { changes, cursor: page.length > 0 ? Number(page[page.length - 1].revision) : since, hasMore: rows.length > limit };
  }

  /** Open conflicts in the sites the user may read, oldest first. */
  async listConflicts(user: CurrentUser, status: 'open' | 'resolved' = 'open'): Promise<ConflictView[]> {
    assertCan(user, 'site:read');
    const readable = readableSiteIds(user);
    const where: Record<string, unknown> = { status };
    if (readable !== 'all') {
      where['siteId'] = { [Op.in]: [...readable] };
    }
    const rows = await SyncConflict.findAll({ where, order: [['createdAt', 'ASC']], limit: 500 });
    return rows.map(toConflictView);
  }

  /**
   * Settles a conflict (geologists): keep the server's version, apply the device's, or write a
   * merged record. The chosen version becomes a new revision on top of whatever the server holds now.
   */
  async resolveConflict(user: CurrentUser, conflictId: string, resolution: ResolveConflictRequest): Promise<{ conflict: ConflictView; revision: number }> {
    assertCan(user, 'capture:resolve-conflict');
    return this.database.transaction(async (transaction) => {
      const conflict = await SyncConflict.findByPk(conflictId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!conflict || !can(user, 'site:read', { siteId: conflict.siteId })) {
        throw new AppError('not_found', 'No such conflict');
      }
      assertCan(user, 'capture:resolve-conflict', { siteId: conflict.siteId });
      if (conflict.status !== 'open') {
        throw new AppError('conflict', 'This conflict is already resolved');
      }
      const store = STORES[conflict.entity];
      const current = (await store.findMany([conflict.recordId], transaction)).get(conflict.recordId);
      if (!current) {
        throw new AppError('internal', 'The conflicting record is missing');
      }
      let revision = current.revision;
      if (resolution.choice !== 'server') {
        const isDelete = resolution.choice === 'device' && conflict.deviceOp === 'delete';
        const candidate = resolution.choice === 'merged' ? { ...resolution.data, id: conflict.recordId } : conflict.deviceData;
        let data: EntityData[SyncEntity] = current.data;
        if (!isDelete) {
          const parsed = parseEntityData(conflict.entity, candidate);
          if (!parsed.ok) {
            throw new AppError('validation_failed', 'The chosen version is not a valid record', parsed.errors);
          }
          data = parsed.data;
        }
        revision = await this.writeResolved(conflict, current, data, isDelete, transaction);
      }
      await conflict.update({ status: 'resolved', resolution: resolution.choice, resolvedById: user.id, resolvedAt: this.now() }, { transaction });
      return { conflict: toConflictView(conflict), revision };
    });
  }

  /** The short number for a device's codes: given on first ask, the same ever after. */
  async registerDevice(user: CurrentUser, deviceId: string): Promise<DeviceRegistration> {
    assertCan(user, 'capture:write');
    const existing = await DeviceNumber.findByPk(deviceId);
    if (existing) {
      return { deviceId, deviceNumber: existing.number };
    }
    return this.database.transaction(async (transaction) => {
      // Two first syncs at once (or one device asking twice) must not take the same number: lock the
      // revision counter row, the one every writer already queues on, so registrations run one at a time.
      await SyncRevision.findByPk(1, { transaction, lock: transaction.LOCK.UPDATE });
      const again = await DeviceNumber.findByPk(deviceId, { transaction });
      if (again) {
        return { deviceId, deviceNumber: again.number };
      }
      const highest = (await DeviceNumber.max('number', { transaction })) as number | null;
      const number = (highest ?? 0) + 1;
      await DeviceNumber.create({ deviceId, number, userId: user.id }, { transaction });
      return { deviceId, deviceNumber: number };
    });
  }

  /** Reads, in bulk, everything the batch's mutations will look at. */
  private async loadBatch(mutations: readonly Mutation[], batch: BatchState, transaction: Transaction): Promise<Map<string, SyncMutation>> {
    const previous = await SyncMutation.findAll({ where: { mutationId: { [Op.in]: mutations.map((mutation) => mutation.mutationId) } }, transaction });
    const idsByEntity = new Map<SyncEntity, Set<string>>();
    const want = (entity: SyncEntity, id: string) => idsByEntity.set(entity, (idsByEntity.get(entity) ?? new Set()).add(id));
    const codesBySite = new Map<string, Set<string>>();
    for (const mutation of mutations) {
      want(mutation.entity, mutation.id);
      // Only a hint of what to read: the data is checked (zod) when the mutation is classified, so
      // here its parent reference is taken as it stands, and anything but an id of a known kind is skipped.
      if (typeof mutation.data === 'object' && mutation.data !== null) {
        const parent = STORES[mutation.entity].parentOf(mutation.data as never);
        if (parent && typeof parent.id === 'string' && UUID_TEXT.test(parent.id) && Object.hasOwn(STORES, parent.entity)) {
          want(parent.entity, parent.id);
        }
      }
    }
    for (const [entity, ids] of idsByEntity) {
      const found = await STORES[entity].findMany([...ids], transaction);
      for (const id of ids) {
        batch.records.set(keyOf(entity, id), found.get(id) ?? null);
      }
    }
    const newPileSites = new Map<string, string>();
    for (const mutation of mutations) {
      const siteId = (mutation.data as { siteId?: unknown } | null)?.siteId;
      if (mutation.entity === 'pile' && typeof siteId === 'string') {
        newPileSites.set(mutation.id, siteId);
      }
    }
    for (const mutation of mutations) {
      const code = (mutation.data as { code?: unknown } | null)?.code;
      const siteId = (mutation.data as { siteId?: unknown } | null)?.siteId;
      if (typeof code === 'string') {
        // Piles name their site; a sample's site is its pile's, known once the pile is loaded.
        const pileId = (mutation.data as { pileId?: unknown }).pileId;
        const site = typeof siteId === 'string'
          ? siteId
          : typeof pileId === 'string' ? (batch.record('pile', pileId)?.siteId ?? newPileSites.get(pileId)) : undefined;
        if (site && UUID_TEXT.test(site)) {
          codesBySite.set(`${mutation.entity}|${site}`, (codesBySite.get(`${mutation.entity}|${site}`) ?? new Set()).add(code));
        }
      }
    }
    for (const [entitySite, codes] of codesBySite) {
      const [entity, siteId] = entitySite.split('|') as [SyncEntity, string];
      for (const [code, id] of await STORES[entity].findIdsByCode(siteId, [...codes], transaction)) {
        batch.codes.set(`${entity}|${siteId}|${code}`, id);
      }
    }
    return new Map(previous.map((row) => [row.mutationId, row]));
  }

  /** Decides and stages one mutation. */
  private async applyOne(
    user: CurrentUser, deviceId: string, mutation: Mutation, batch: BatchState, previous: Map<string, SyncMutation>, transaction: Transaction,
  ): Promise<MutationResult> {
    const answer = (status: MutationResult['status'], revision: number | null, errors: readonly FieldError[] = [], conflictId?: string): MutationResult =>
      ({ mutationId: mutation.mutationId, status, revision, errors, ...(conflictId ? { conflictId } : {}) });

    const earlier = previous.get(mutation.mutationId);
    if (earlier) {
      return answer('duplicate', earlier.revision, [], earlier.conflictId ?? undefined);
    }
    const staged = batch.appliedMutations.get(mutation.mutationId);
    if (staged) {
      return answer('duplicate', staged.revision);
    }
    const store = STORES[mutation.entity];
    const current = batch.record(mutation.entity, mutation.id) ?? (await this.lookUp(mutation.entity, mutation.id, batch, transaction));
    if (current && !can(user, 'capture:write', { siteId: current.siteId, ownerId: current.ownerId })) {
      return answer('rejected', null, forbidden('You may not change this record'));
    }
    const decision = classifyMutation(current ? { revision: current.revision, isDeleted: current.deletedAt !== null } : null, batch.seenMutationIds, mutation);
    if (decision.status === 'rejected') {
      return answer('rejected', null, decision.errors);
    }
    if (decision.status === 'duplicate') {
      return answer('duplicate', current?.revision ?? null);
    }
    if (decision.status === 'conflict') {
      const server = current as StoredRecord;
      const conflictId = randomUUID();
      batch.conflicts.push({
        id: conflictId, entity: mutation.entity, recordId: mutation.id, siteId: server.siteId, mutationId: mutation.mutationId,
        deviceId, userId: user.id, baseRevision: mutation.baseRevision, serverRevision: server.revision, deviceOp: mutation.op,
        deviceData: mutation.data ?? null, serverData: server.data, status: 'open',
      });
      batch.appliedMutations.set(mutation.mutationId, { mutationId: mutation.mutationId, entity: mutation.entity, recordId: mutation.id, status: 'conflict', revision: server.revision, conflictId });
      return answer('conflict', server.revision, [], conflictId);
    }
    if (decision.write === 'none') {
      batch.appliedMutations.set(mutation.mutationId, { mutationId: mutation.mutationId, entity: mutation.entity, recordId: mutation.id, status: 'applied', revision: current?.revision ?? null, conflictId: null });
      return answer('applied', current?.revision ?? null);
    }

    let siteId: string;
    let data: EntityData[SyncEntity];
    if (decision.write === 'delete') {
      siteId = (current as StoredRecord).siteId;
      data = (current as StoredRecord).data;
    } else {
      data = decision.data as EntityData[SyncEntity];
      const placed = await this.placeOf(store, data, batch, transaction);
      if ('errors' in placed) {
        return answer('rejected', null, placed.errors);
      }
      siteId = placed.siteId;
      if (current && current.siteId !== siteId) {
        return answer('rejected', null, [{ path: 'siteId', message: 'A record cannot move to another site' }]);
      }
      if (!current && !can(user, 'capture:write', { siteId })) {
        return answer('rejected', null, forbidden('You may not record data at this site'));
      }
      const code = store.codeOf(data as never);
      if (code !== null) {
        const holder = batch.codes.get(`${mutation.entity}|${siteId}|${code}`);
        if (holder !== undefined && holder !== mutation.id) {
          return answer('rejected', null, [{ path: 'code', message: `The code ${code} is already used at this site; give this record another code` }]);
        }
        batch.codes.set(`${mutation.entity}|${siteId}|${code}`, mutation.id);
      }
    }

    batch.revision.value += 1;
    const revision = batch.revision.value;
    const deletedAt = decision.write === 'delete' ? this.now() : null;
    const write: RecordWrite = {
      id: mutation.id, siteId, data, revision, deletedAt, createdById: current?.ownerId ?? user.id, deviceId,
    };
    const writes = batch.writes.get(mutation.entity) ?? new Map<string, RecordWrite>();
    writes.set(mutation.id, write);
    batch.writes.set(mutation.entity, writes);
    batch.records.set(keyOf(mutation.entity, mutation.id), {
      entity: mutation.entity, id: mutation.id, siteId, ownerId: write.createdById, revision, deletedAt, data,
    });
    batch.changes.set(keyOf(mutation.entity, mutation.id), { entity: mutation.entity, recordId: mutation.id, revision, siteId, isDeleted: deletedAt !== null });
    batch.seenMutationIds.add(mutation.mutationId);
    batch.appliedMutations.set(mutation.mutationId, { mutationId: mutation.mutationId, entity: mutation.entity, recordId: mutation.id, status: 'applied', revision, conflictId: null });
    return answer('applied', revision);
  }

  /** The site a record belongs to: its own for a pile, its live parent's for the rest. */
  private async placeOf(store: RecordStore, data: EntityData[SyncEntity], batch: BatchState, transaction: Transaction): Promise<{ siteId: string } | { errors: FieldError[] }> {
    const parentRef = store.parentOf(data as never);
    if (!parentRef) {
      const siteId = store.ownSiteId(data as never);
      return siteId ? { siteId } : { errors: [{ path: 'siteId', message: 'The record names no site' }] };
    }
    const parent = batch.record(parentRef.entity, parentRef.id) ?? (await this.lookUp(parentRef.entity, parentRef.id, batch, transaction));
    if (!parent || parent.deletedAt !== null) {
      return { errors: [{ path: parentRef.field, message: `The ${parentRef.entity} this belongs to is not on the server (sync it first, or it was deleted)` }] };
    }
    return { siteId: parent.siteId };
  }

  private async lookUp(entity: SyncEntity, id: string, batch: BatchState, transaction: Transaction): Promise<StoredRecord | null> {
    if (batch.records.has(keyOf(entity, id))) {
      return batch.record(entity, id);
    }
    const found = (await STORES[entity].findMany([id], transaction)).get(id) ?? null;
    batch.records.set(keyOf(entity, id), found);
    return found;
  }

  /** Writes what the batch staged: records parents first, then the change log, answers and conflicts. */
  private async flush(user: CurrentUser, deviceId: string, batch: BatchState, transaction: Transaction): Promise<void> {
    for (const entity of WRITE_ORDER) {
      const writes = batch.writes.get(entity);
      if (writes) {
        await (STORES[entity] as RecordStore).writeMany([...writes.values()], transaction);
      }
    }
    await insertRows(ChangeLogEntry, [...batch.changes.values()], { transaction, updateOnDuplicate: CHANGE_LOG_UPDATES });
    await insertRows(SyncConflict, batch.conflicts, { transaction });
    await insertRows(SyncMutation, [...batch.appliedMutations.values()].map((applied) => ({ ...applied, deviceId, userId: user.id })), { transaction });
  }

  /** Writes a conflict's chosen version as a new revision. */
  private async writeResolved(conflict: SyncConflict, current: StoredRecord, data: EntityData[SyncEntity], isDelete: boolean, transaction: Transaction): Promise<number> {
    const counter = await SyncRevision.findByPk(1, { transaction, lock: transaction.LOCK.UPDATE });
    const revision = (counter?.value ?? 0) + 1;
    await SyncRevision.update({ value: revision }, { where: { id: 1 }, transaction });
    const deletedAt = isDelete ? this.now() : null;
    await (STORES[conflict.entity] as RecordStore).writeMany([
      { id: current.id, siteId: current.siteId, data, revision, deletedAt, createdById: current.ownerId, deviceId: conflict.deviceId },
    ], transaction);
    await insertRows(ChangeLogEntry, [{ entity: conflict.entity, recordId: current.id, revision, siteId: current.siteId, isDeleted: isDelete }], {
      transaction, updateOnDuplicate: CHANGE_LOG_UPDATES,
    });
    return revision;
  }
}

function toConflictView(conflict: SyncConflict): ConflictView {
  return {
    id: conflict.id, entity: conflict.entity, recordId: conflict.recordId, siteId: conflict.siteId, deviceId: conflict.deviceId,
    baseRevision: conflict.baseRevision, serverRevision: conflict.serverRevision, deviceOp: conflict.deviceOp,
    deviceData: conflict.deviceData, serverData: conflict.serverData, status: conflict.status,
    createdAt: conflict.createdAt.toISOString(),
  };
}
