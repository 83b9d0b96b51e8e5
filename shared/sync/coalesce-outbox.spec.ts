import fc from 'fast-check';
import { coalesceOutbox, type PendingMutation } from './coalesce-outbox';

let counter = 0;
function entry(overrides: Partial<PendingMutation> = {}): PendingMutation {
  counter += 1;
  return { mutationId: `m${counter}`, entity: 'pile', id: 'p1', op: 'upsert', baseRevision: null, data: { v: counter }, isInFlight: false, ...overrides };
}

describe('coalesceOutbox', () => {
  it('folds two upserts of a new record into one with the later data and no base', () => {
    const first = entry();
    const second = entry();
    const result = coalesceOutbox([first, second]);
    expect(result.keep).toEqual([{ ...second, baseRevision: null }]);
    expect(result.droppedMutationIds).toEqual([first.mutationId]);
  });

  it('folds two upserts of a synced record keeping the earlier base revision', () => {
    const first = entry({ baseRevision: 7 });
    const second = entry({ baseRevision: 7 });
    expect(coalesceOutbox([first, second]).keep).toEqual([{ ...second, baseRevision: 7 }]);
  });

  it('drops a record created and deleted offline entirely', () => {
    const created = entry();
    const deleted = entry({ op: 'delete', data: null });
    expect(coalesceOutbox([created, deleted])).toEqual({ keep: [], droppedMutationIds: [created.mutationId, deleted.mutationId] });
  });

  it('turns an edit then a delete of a synced record into one delete on the synced base', () => {
    const edited = entry({ baseRevision: 3 });
    const deleted = entry({ op: 'delete', data: null, baseRevision: 3 });
    expect(coalesceOutbox([edited, deleted]).keep).toEqual([{ ...deleted, baseRevision: 3 }]);
  });

  it('turns a delete then an upsert into one upsert on the delete base (restore)', () => {
    const deleted = entry({ op: 'delete', data: null, baseRevision: 5 });
    const restored = entry({ baseRevision: 5 });
    expect(coalesceOutbox([deleted, restored]).keep).toEqual([{ ...restored, baseRevision: 5 }]);
  });

  it('folds two deletes into one', () => {
    const first = entry({ op: 'delete', data: null, baseRevision: 5 });
    const second = entry({ op: 'delete', data: null, baseRevision: 5 });
    expect(coalesceOutbox([first, second]).keep).toEqual([second]);
  });

  it('never folds into a mutation in flight, so its resend repeats the same id and content', () => {
    const sent = entry({ isInFlight: true });
    const later = entry();
    expect(coalesceOutbox([sent, later])).toEqual({ keep: [sent, later], droppedMutationIds: [] });
  });

  it('never folds a mutation in flight into an earlier one', () => {
    const queued = entry();
    const sent = entry({ isInFlight: true });
    expect(coalesceOutbox([queued, sent]).keep).toEqual([queued, sent]);
  });

  it('leaves other records alone and keeps their order', () => {
    const pileA = entry({ id: 'a' });
    const sample = entry({ entity: 'sample', id: 'a' });
    const pileA2 = entry({ id: 'a' });
    expect(coalesceOutbox([pileA, sample, pileA2]).keep.map((kept) => kept.mutationId)).toEqual([sample.mutationId, pileA2.mutationId]);
  });

  it('does not change the list it is given', () => {
    const list = [entry(), entry()];
    const copy = structuredClone(list);
    coalesceOutbox(list);
    expect(list).toEqual(copy);
  });

  it('for any outbox, accounts for every mutation once, keeps every in-flight one and at most one queued mutation per record after the last in-flight one', () => {
    const arbitraryEntry = fc.record({
      id: fc.constantFrom('a', 'b', 'c'),
      op: fc.constantFrom<'upsert' | 'delete'>('upsert', 'delete'),
      isInFlight: fc.boolean(),
    });
    fc.assert(fc.property(fc.array(arbitraryEntry, { maxLength: 30 }), (shapes) => {
      const pending = shapes.map((shape, index) => ({ ...entry(shape), mutationId: `x${index}` }));
      const { keep, droppedMutationIds } = coalesceOutbox(pending);
      const inFlight = pending.filter((item) => item.isInFlight).map((item) => item.mutationId);
      expect(keep.filter((item) => item.isInFlight).map((item) => item.mutationId)).toEqual(inFlight);
      const accounted = [...keep.map((item) => item.mutationId), ...droppedMutationIds].sort();
      expect(accounted).toEqual(pending.map((item) => item.mutationId).sort());
      for (const id of ['a', 'b', 'c']) {
        const ofRecord = keep.filter((item) => item.id === id);
        const lastInFlight = ofRecord.map((item) => item.isInFlight).lastIndexOf(true);
        expect(ofRecord.slice(lastInFlight + 1).length).toBeLessThanOrEqual(1);
      }
    }));
  });
});
