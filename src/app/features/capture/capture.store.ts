import { Injectable, computed, inject, signal } from '@angular/core';
import { liveQuery } from 'dexie';
import { makeHumanCode } from '../../../../shared/sync/human-code';
import type { EntityData, PanTestData, PileData, SampleData } from '../../../../shared/sync/protocol';
import { AuthSession } from '../../core/auth/auth-session';
import { heapsightDb, type LocalPile, type LocalSample } from '../../core/db/heapsight-db';
import { StorageFullError } from '../../core/db/storage-full';
import { StorageFullNotice } from '../../core/db/storage-full-notice';
import { saveRecord, tableOf } from '../../core/sync/device-outbox';
import { SyncService } from '../../core/sync/sync.service';
import { resizePhoto, type ResizedPhoto } from './photo-resize';

/**
 * Piles and samples on this device, as signals over Dexie, for the forms' pickers, and the ways to
 * record piles, samples, pan tests and photos. (Capture home reads counts and pages itself, and never
 * every pan test or photo with its bytes.)
 */
@Injectable({ providedIn: 'root' })
export class CaptureStore {
  private readonly db = heapsightDb();
  private readonly session = inject(AuthSession);
  private readonly sync = inject(SyncService);
  private readonly storageFull = inject(StorageFullNotice);

  readonly piles = signal<LocalPile[]>([]);
  readonly samples = signal<LocalSample[]>([]);
  readonly livePiles = computed(() => this.piles().filter((pile) => pile.deletedAt === null));

  constructor() {
    liveQuery(() => this.db.piles.orderBy('code').toArray()).subscribe((rows) => this.piles.set(rows));
    liveQuery(() => this.db.samples.orderBy('code').toArray()).subscribe((rows) => this.samples.set(rows.filter((row) => row.deletedAt === null)));
  }

  /** The sites this person may record at, with codes for the human codes. */
  sites(): { id: string; code: string; name: string }[] {
    const user = this.session.user() as { siteIds: readonly string[]; sites?: readonly { id: string; code: string; name: string }[] } | null;
    return user?.sites ? [...user.sites] : (user?.siteIds ?? []).map((id) => ({ id, code: 'XX', name: id }));
  }

  /** This device's id, as samples record it. */
  deviceId(): Promise<string> {
    return this.sync.deviceId();
  }

  userId(): string {
    return this.session.user()?.id ?? '';
  }

  /** Next code `SITE-DEVICE-SEQ` for a pile or sample at a site, counted on this device. */
  async nextCode(siteCode: string, kind: 'pile' | 'sample'): Promise<string> {
    const deviceNumber = (await this.sync.deviceNumber()) ?? fallbackDeviceNumber(await this.sync.deviceId());
    const key = `sequence:${kind}:${siteCode}`;
    // A full phone refuses the counter too: the notice shows and the form keeps what was typed.
    return this.storageFull.guard(() => this.db.transaction('rw', this.db.syncState, async () => {
      const sequence = (((await this.db.syncState.get(key))?.value as number | undefined) ?? 0) + 1;
      await this.db.syncState.put({ key, value: sequence });
      return makeHumanCode({ siteCode, deviceNumber, sequence, kind });
    }));
  }

  /** True when a sample on this device (live or deleted) already carries the code; the server refuses a repeat at push too. */
  async isSampleCodeTaken(code: string): Promise<boolean> {
    return (await this.db.samples.where('code').equals(code).count()) > 0;
  }

  /** Records a pile with the photos taken for it, all or nothing. */
  savePile(pile: PileData, photos: readonly Blob[] = []): Promise<void> {
    return this.saveWithPhotos('pile', pile, photos);
  }

  /** Records a sample with the photos taken for it, all or nothing. */
  saveSample(sample: SampleData, photos: readonly Blob[] = []): Promise<void> {
    return this.saveWithPhotos('sample', sample, photos);
  }

  savePanTest(panTest: PanTestData): Promise<void> {
    return this.saveWithPhotos('panTest', panTest, []);
  }

  /** Resizes a camera picture and records it against a pile or sample already saved. */
  async addPhoto(ownerEntity: 'pile' | 'sample', ownerId: string, file: Blob): Promise<void> {
    const resized = await resizePhoto(file);
    await this.storageFull.guard(() => this.writePhoto(ownerEntity, ownerId, resized));
  }

  /**
   * The record, its photos and their outbox entries in one transaction: a full phone, a crash or a
   * closed page leaves all of them or none, so a second tap on Save never makes a second record.
   * Photos are resized first, outside the transaction (IndexedDB ends a transaction that waits on
   * other work).
   */
  private async saveWithPhotos<E extends 'pile' | 'sample' | 'panTest'>(entity: E, data: EntityData[E], photos: readonly Blob[]): Promise<void> {
    const resized: ResizedPhoto[] = [];
    for (const photo of photos) {
      resized.push(await resizePhoto(photo));
    }
    const now = new Date().toISOString();
    await this.storageFull.guard(() => this.db.transaction('rw', [tableOf(this.db, entity), this.db.photos, this.db.outbox], async () => {
      await saveRecord(this.db, entity, data, { mutationId: crypto.randomUUID(), now });
      for (const photo of resized) {
        await this.writePhoto(entity as 'pile' | 'sample', data.id, photo);
      }
    }));
  }

  private async writePhoto(ownerEntity: 'pile' | 'sample', ownerId: string, resized: ResizedPhoto): Promise<void> {
    const photo = {
      id: crypto.randomUUID(), ownerEntity, ownerId, contentType: 'image/jpeg' as const, originalWidth: resized.originalWidth,
      originalHeight: resized.originalHeight, byteSize: resized.blob.size, takenAt: new Date().toISOString(),
    };
    await saveRecord(this.db, 'photo', photo, { mutationId: crypto.randomUUID(), now: new Date().toISOString() }, {
      blob: resized.blob, thumbnail: resized.thumbnail, isUploaded: false,
    });
  }

  /** Keeps a half-filled form so closing the app loses nothing. */
  async saveDraft(key: string, value: unknown): Promise<void> {
    // A full phone refuses the draft too: the notice is shown, and the form (still open) keeps the values.
    await this.storageFull.guard(() => this.db.drafts.put({ key, value, savedAt: new Date().toISOString() })).catch((error: unknown) => {
      if (!(error instanceof StorageFullError)) throw error;
    });
  }

  async draft<T>(key: string): Promise<T | null> {
    return ((await this.db.drafts.get(key))?.value as T | undefined) ?? null;
  }

  async clearDraft(key: string): Promise<void> {
    await this.db.drafts.delete(key);
  }
}

/** Before the server has given this device a number: one from its id (9000–9998), so codes still differ per device. */
function fallbackDeviceNumber(deviceId: string): number {
  let hash = 0;
  for (const character of deviceId) {
    hash = (hash * 31 + character.charCodeAt(0)) >>> 0;
  }
  return 9000 + (hash % 999);
}
