import type { MutationOp, SyncEntity } from './protocol';

/** An outbox entry as the coalescer sees it; the device's entry may carry more fields. */
export interface PendingMutation {
  readonly mutationId: string;
  readonly entity: SyncEntity;
  readonly id: string;
  readonly op: MutationOp;
  readonly baseRevision: number | null;
  readonly data: unknown;
  /** True once the mutation has been sent and no answer has come back; it must be resent as it is. */
  readonly isInFlight: boolean;
}

/** The outbox after folding: the entries to keep, in order, and the mutation ids to drop. */
export interface CoalescedOutbox<T extends PendingMutation> {
  readonly keep: readonly T[];
  readonly droppedMutationIds: readonly string[];
}

/**
 * Folds successive queued mutations of one record into one, so a pile edited ten times offline
 * goes up as one change. The table (earlier × later, both not in flight):
 *
 * | earlier \ later        | upsert                                   | delete                          |
 * |------------------------|------------------------------------------|---------------------------------|
 * | upsert, base null      | one upsert, base null, later data         | both dropped (never left device)|
 * | upsert, base n         | one upsert, base n, later data            | one delete, base n              |
 * | delete, base n         | one upsert, base n, later data (undelete) | one delete, base n              |
 *
 * The folded entry keeps the later mutation's id and the earlier one's base revision (the revision
 * the server holds). An entry in flight is never folded, nor folded into: a resend must repeat the
 * same mutation id with the same content. The order of the kept entries is preserved.
 */
export function coalesceOutbox<T extends PendingMutation>(pending: readonly T[]): CoalescedOutbox<T> {
  const keep: (T | null)[] = [];
  const dropped: string[] = [];
  const openIndexByRecord = new Map<string, number>();

  for (const next of pending) {
    const key = `${next.entity}:${next.id}`;
    const openIndex = openIndexByRecord.get(key);
    const previous = openIndex === undefined ? null : keep[openIndex];
    if (next.isInFlight || previous === null || previous === undefined || previous.isInFlight) {
      keep.push(next);
      openIndexByRecord.set(key, keep.length - 1);
      continue;
    }
    dropped.push(previous.mutationId);
    if (previous.op === 'upsert' && previous.baseRevision === null && next.op === 'delete') {
      dropped.push(next.mutationId);
      keep[openIndex as number] = null;
      openIndexByRecord.delete(key);
      continue;
    }
    keep[openIndex as number] = null;
    keep.push({ ...next, baseRevision: previous.baseRevision });
    openIndexByRecord.set(key, keep.length - 1);
  }
  return { keep: keep.filter((entry): entry is T => entry !== null), droppedMutationIds: dropped };
}
