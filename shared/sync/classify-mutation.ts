import { parseEntityData, type EntityData, type FieldError, type Mutation, type SyncEntity } from './protocol';

/** What the server holds for a mutation's record, or null when it has never seen the id. */
export interface CurrentRecord {
  readonly revision: number;
  readonly isDeleted: boolean;
}

/** What the server should do with one mutation. `write` says how the store changes on `applied`. */
export type Classification =
  | { readonly status: 'duplicate' }
  | { readonly status: 'rejected'; readonly errors: readonly FieldError[] }
  | { readonly status: 'conflict'; readonly reason: 'stale-base' | 'created-elsewhere' }
  | { readonly status: 'applied'; readonly write: 'create' | 'update' | 'delete' | 'none'; readonly data: EntityData[SyncEntity] | null };

/**
 * Decides one mutation against the server's current record (pure; permissions are checked by the
 * caller, who knows the user).
 *
 * - a mutation id already applied is a `duplicate`, whatever else is true (a resend is safe);
 * - the data must match its entity's schema and say the same id as the mutation, else `rejected`;
 * - a new record (`baseRevision` null) is created; if the id already exists it is a `conflict`;
 * - a change on top of the revision the server holds is `applied`; on any other revision it is a
 *   `conflict`, so the server keeps both versions instead of overwriting either;
 * - a delete of a record the server never saw changes nothing (it was born and died offline);
 *   a delete of a record already deleted is applied as a no-op.
 */
export function classifyMutation(current: CurrentRecord | null, seenMutationIds: ReadonlySet<string>, mutation: Mutation): Classification {
  if (seenMutationIds.has(mutation.mutationId)) {
    return { status: 'duplicate' };
  }
  if (mutation.op === 'delete') {
    return classifyDelete(current, mutation);
  }
  const parsed = parseEntityData(mutation.entity, mutation.data);
  if (!parsed.ok) {
    return { status: 'rejected', errors: parsed.errors };
  }
  if (parsed.data.id !== mutation.id) {
    return { status: 'rejected', errors: [{ path: 'id', message: 'The record id differs from the mutation id' }] };
  }
  if (current === null) {
    if (mutation.baseRevision !== null) {
      return { status: 'rejected', errors: [{ path: 'baseRevision', message: 'The server has no record with this id to update' }] };
    }
    return { status: 'applied', write: 'create', data: parsed.data };
  }
  if (mutation.baseRevision === null) {
    return { status: 'conflict', reason: 'created-elsewhere' };
  }
  if (mutation.baseRevision !== current.revision) {
    return { status: 'conflict', reason: 'stale-base' };
  }
  return { status: 'applied', write: 'update', data: parsed.data };
}

function classifyDelete(current: CurrentRecord | null, mutation: Mutation): Classification {
  if (current === null) {
    return { status: 'applied', write: 'none', data: null };
  }
  if (mutation.baseRevision !== current.revision) {
    return { status: 'conflict', reason: 'stale-base' };
  }
  if (current.isDeleted) {
    return { status: 'applied', write: 'none', data: null };
  }
  return { status: 'applied', write: 'delete', data: null };
}
