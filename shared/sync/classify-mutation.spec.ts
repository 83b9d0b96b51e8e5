import { classifyMutation } from './classify-mutation';
import { aPile, PILE_ID } from './fixtures.spec-helper';
import type { Mutation } from './protocol';

const NONE = new Set<string>();

function upsert(baseRevision: number | null, data: unknown = aPile()): Mutation {
  return { mutationId: '0b6f3c2e-1a4d-4e8b-9c7d-00000000aaaa', entity: 'pile', id: PILE_ID, op: 'upsert', baseRevision, data };
}

function remove(baseRevision: number | null): Mutation {
  return { ...upsert(baseRevision), op: 'delete', data: null };
}

describe('classifyMutation', () => {
  it('when the mutation id was seen before, answers duplicate even if the record moved on', () => {
    const seen = new Set([upsert(null).mutationId]);
    expect(classifyMutation({ revision: 9, isDeleted: false }, seen, upsert(null))).toEqual({ status: 'duplicate' });
  });

  it('when the record is new and valid, creates it', () => {
    expect(classifyMutation(null, NONE, upsert(null))).toEqual({ status: 'applied', write: 'create', data: aPile() });
  });

  it('when the data fails its schema, rejects with the field and reason', () => {
    const result = classifyMutation(null, NONE, upsert(null, { ...aPile(), material: 'gravel' }));
    expect(result).toMatchObject({ status: 'rejected', errors: [{ path: 'material' }] });
  });

  it('when the data names another id than the mutation, rejects', () => {
    const result = classifyMutation(null, NONE, upsert(null, aPile({ id: '0b6f3c2e-1a4d-4e8b-9c7d-00000000ffff' })));
    expect(result).toMatchObject({ status: 'rejected', errors: [{ path: 'id' }] });
  });

  it('when an update names a record the server never had, rejects rather than inventing it', () => {
    expect(classifyMutation(null, NONE, upsert(3))).toMatchObject({ status: 'rejected', errors: [{ path: 'baseRevision' }] });
  });

  it('when a "new" record id already exists on the server, is a conflict', () => {
    expect(classifyMutation({ revision: 4, isDeleted: false }, NONE, upsert(null))).toEqual({ status: 'conflict', reason: 'created-elsewhere' });
  });

  it('when the update is on top of the server revision, applies it', () => {
    expect(classifyMutation({ revision: 4, isDeleted: false }, NONE, upsert(4))).toEqual({ status: 'applied', write: 'update', data: aPile() });
  });

  it('when the update is on an older revision, is a conflict and not an overwrite', () => {
    expect(classifyMutation({ revision: 5, isDeleted: false }, NONE, upsert(4))).toEqual({ status: 'conflict', reason: 'stale-base' });
  });

  it('when a delete is on top of the server revision, deletes', () => {
    expect(classifyMutation({ revision: 4, isDeleted: false }, NONE, remove(4))).toEqual({ status: 'applied', write: 'delete', data: null });
  });

  it('when a delete is on an older revision, is a conflict', () => {
    expect(classifyMutation({ revision: 6, isDeleted: false }, NONE, remove(4))).toEqual({ status: 'conflict', reason: 'stale-base' });
  });

  it('when the record to delete was never on the server, changes nothing', () => {
    expect(classifyMutation(null, NONE, remove(null))).toEqual({ status: 'applied', write: 'none', data: null });
  });

  it('when the record is already deleted at that revision, changes nothing', () => {
    expect(classifyMutation({ revision: 4, isDeleted: true }, NONE, remove(4))).toEqual({ status: 'applied', write: 'none', data: null });
  });

  it('when an upsert comes on top of a deleted revision, restores the record', () => {
    expect(classifyMutation({ revision: 4, isDeleted: true }, NONE, upsert(4))).toMatchObject({ status: 'applied', write: 'update' });
  });
});
