import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { EMPTY } from 'rxjs';
import { deserialize, serialize } from 'node:v8';
import type { SampleData } from '../../../../shared/sync/protocol';
import { AuthSession } from '../../core/auth/auth-session';
import { heapsightDb } from '../../core/db/heapsight-db';
import { StorageFullError } from '../../core/db/storage-full';
import { SyncService } from '../../core/sync/sync.service';
import { CaptureStore } from './capture.store';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

// Canvas resizing is Chromium's job (photo-resize.spec and the e2e cover it); here a photo is its bytes.
jest.mock('./photo-resize', () => ({
  resizePhoto: async (file: Blob) => ({ blob: file, thumbnail: file, originalWidth: 4000, originalHeight: 3000 }),
}));

const sample: SampleData = {
  id: '5b000000-0000-4000-8000-000000000001', pileId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b02', code: 'JR-07-000001', sampleType: 'routine',
  duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: null, wetMassKg: 11.4, moisturePct: 8, increments: 10, position: 'toe',
  collectedAt: '2026-11-30T08:00:00.000Z', collectorId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', deviceId: 'spec',
} as SampleData;

const photo = () => new Blob([new Uint8Array(2048)], { type: 'image/jpeg' });
const phoneIsFull = () => new DOMException('The quota has been exceeded.', 'QuotaExceededError');

describe('CaptureStore writes on the device', () => {
  const db = heapsightDb();
  let snackBar: { open: jest.Mock };
  let store: CaptureStore;

  beforeEach(async () => {
    await Promise.all(db.tables.map((table) => table.clear()));
    snackBar = { open: jest.fn(() => ({ onAction: () => EMPTY, afterDismissed: () => EMPTY })) };
    TestBed.configureTestingModule({
      providers: [
        { provide: MatSnackBar, useValue: snackBar },
        { provide: AuthSession, useValue: { user: () => null } },
        { provide: SyncService, useValue: { deviceId: async () => 'spec', deviceNumber: async () => 7 } },
      ],
    });
    store = TestBed.inject(CaptureStore);
  });

  afterEach(() => jest.restoreAllMocks());

  it('saves a sample, its photos and one outbox entry for each in one go', async () => {
    await store.saveSample(sample, [photo(), photo()]);

    expect(await db.samples.get(sample.id)).toMatchObject({ code: 'JR-07-000001', hasPendingChange: true });
    expect(await db.photos.where('ownerId').equals(sample.id).count()).toBe(2);
    expect((await db.outbox.toArray()).map((entry) => entry.entity).sort()).toEqual(['photo', 'photo', 'sample']);
    expect(snackBar.open).not.toHaveBeenCalled();
  });

  it('on a full phone, keeps neither the sample nor any photo nor an outbox entry, says so, and rejects so the form stays open', async () => {
    await store.saveSample({ ...sample, id: '5b000000-0000-4000-8000-000000000002', code: 'JR-07-000002' });
    const put = db.photos.put.bind(db.photos);
    const photoWrites = jest.spyOn(db.photos, 'put');
    photoWrites.mockImplementationOnce((...args) => put(...args)); // the first photo fits
    photoWrites.mockRejectedValueOnce(phoneIsFull()); // the second does not

    await expect(store.saveSample(sample, [photo(), photo()])).rejects.toBeInstanceOf(StorageFullError);

    expect(await db.samples.get(sample.id)).toBeUndefined();
    expect(await db.photos.count()).toBe(0);
    expect((await db.outbox.toArray()).map((entry) => entry.id)).toEqual(['5b000000-0000-4000-8000-000000000002']); // what was saved before is safe
    expect(photoWrites).toHaveBeenCalledTimes(2);
    // At the top, clear of the Save button the message asks for; its button only closes it (leaving would lose the form).
    expect(snackBar.open).toHaveBeenCalledWith(expect.stringContaining('This phone is full'), 'OK', expect.objectContaining({ politeness: 'assertive', verticalPosition: 'top' }));
  });

  it('on a full phone, the next code is refused like the record itself: notice shown, the counter not moved', async () => {
    expect(await store.nextCode('JR', 'sample')).toBe('JR-07-0001');
    jest.spyOn(db.syncState, 'put').mockRejectedValue(phoneIsFull());

    await expect(store.nextCode('JR', 'sample')).rejects.toBeInstanceOf(StorageFullError);
    expect(snackBar.open).toHaveBeenCalledTimes(1);
    jest.restoreAllMocks();
    expect(await store.nextCode('JR', 'sample')).toBe('JR-07-0002');
  });

  it('a refused draft shows the notice once and does not throw into the form while typing', async () => {
    jest.spyOn(db.drafts, 'put').mockRejectedValue(phoneIsFull());

    await expect(store.saveDraft('sample-form', { wetMassKg: 11 })).resolves.toBeUndefined();
    await expect(store.saveDraft('sample-form', { wetMassKg: 11.4 })).resolves.toBeUndefined();

    expect(snackBar.open).toHaveBeenCalledTimes(1);
  });

  it('other write failures are not passed off as a full phone', async () => {
    jest.spyOn(db.drafts, 'put').mockRejectedValue(new Error('disk on fire'));

    await expect(store.saveDraft('sample-form', {})).rejects.toThrow('disk on fire');
    expect(snackBar.open).not.toHaveBeenCalled();
  });
});
