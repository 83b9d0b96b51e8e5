import Dexie from 'dexie';
import { StorageFullError, isStorageFull } from './storage-full';

describe('isStorageFull', () => {
  it('knows the browser refusing a write for lack of space', () => {
    // WebIDL, DOMException error names: "QuotaExceededError", legacy code 22 (from memory).
    expect(isStorageFull(new DOMException('The quota has been exceeded.', 'QuotaExceededError'))).toBe(true);
  });

  it('knows Dexie passing the same error on, alone, wrapped, or once per row of a bulk write', () => {
    const quota = new DOMException('full', 'QuotaExceededError');
    expect(isStorageFull(new Dexie.QuotaExceededError('full'))).toBe(true);
    expect(isStorageFull(new Dexie.AbortError('Transaction aborted', quota))).toBe(true);
    expect(isStorageFull(new Dexie.BulkError('1 of 2 failed', [new Dexie.ConstraintError('key'), quota]))).toBe(true);
    expect(isStorageFull(new StorageFullError(quota))).toBe(true);
  });

  it('does not take other failures for a full phone', () => {
    expect(isStorageFull(new Dexie.ConstraintError('Key already exists'))).toBe(false);
    expect(isStorageFull(new DOMException('gone', 'InvalidStateError'))).toBe(false);
    expect(isStorageFull(new Error('QuotaExceededError'))).toBe(false);
    expect(isStorageFull({ code: 22 })).toBe(false);
    expect(isStorageFull(null)).toBe(false);
    expect(isStorageFull('QuotaExceededError')).toBe(false);
  });
});
