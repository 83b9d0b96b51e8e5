/**
 * A write refused because the phone's storage is full. IndexedDB reports it as a DOMException named
 * `QuotaExceededError`; Dexie passes it on as its own error of the same name, sometimes wrapped
 * (`inner`) or, for bulk writes, one failure per row (`failures`).
 */
export class StorageFullError extends Error {
  constructor(override readonly cause: unknown) {
    super('The phone is full: the write was refused and nothing was changed.');
    this.name = 'StorageFullError';
  }
}

/** True when `error`, or an error it wraps, is the browser refusing a write for lack of space. */
export function isStorageFull(error: unknown, depth = 0): boolean {
  if (depth > 4 || typeof error !== 'object' || error === null) return false;
  const candidate = error as { name?: unknown; inner?: unknown; failures?: unknown };
  if (candidate instanceof StorageFullError || candidate.name === 'QuotaExceededError') return true;
  if (isStorageFull(candidate.inner, depth + 1)) return true;
  return Array.isArray(candidate.failures) && candidate.failures.some((failure) => isStorageFull(failure, depth + 1));
}

/**
 * Runs a form's save; when the phone is full (the notice is already on screen) it ends quietly, so
 * the form stays open with what was typed and the crew can tap Save again once there is room.
 */
export async function keepFormIfStorageFull(save: () => Promise<void>): Promise<void> {
  try {
    await save();
  } catch (error) {
    if (!(error instanceof StorageFullError)) throw error;
  }
}
