import { planQcInsertion, seededShuffle, type PlannedItem } from './qcInsertion';
import { unwrap } from './result';

const ids = (count: number) => Array.from({ length: count }, (_, index) => `S${String(index + 1).padStart(3, '0')}`);
const plan = (overrides: Partial<Parameters<typeof planQcInsertion>[0]> = {}) =>
  unwrap(planQcInsertion({ sampleIds: ids(20), blankEvery: 10, standardEvery: 10, duplicateEvery: 10, standardCodes: ['STD-A', 'STD-B'], seed: 42, ...overrides }));

describe('seededShuffle', () => {
  it('gives the same order for the same seed and keeps every item once', () => {
    const first = seededShuffle(ids(30), 7);
    expect(seededShuffle(ids(30), 7)).toEqual(first);
    expect([...first].sort()).toEqual(ids(30));
    expect(seededShuffle(ids(30), 8)).not.toEqual(first);
  });

  it('does not change the array it is given', () => {
    const items = ids(5);
    seededShuffle(items, 3);
    expect(items).toEqual(ids(5));
  });

  // Fisher–Yates gives every permutation with equal probability (Knuth, TAOCP vol. 2, §3.4.2):
  // over 6000 seeds each of the 6 orders of three items should turn up about 1000 times.
  it('makes every order of three items about equally likely over many seeds', () => {
    const counts = new Map<string, number>();
    for (let seed = 0; seed < 6000; seed += 1) {
      const key = seededShuffle(['a', 'b', 'c'], seed).join('');
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(6);
    // Chi-square with 5 degrees of freedom: 20.5 is the 0.001 critical value (standard table).
    const chiSquare = [...counts.values()].reduce((sum, count) => sum + (count - 1000) ** 2 / 1000, 0);
    expect(chiSquare).toBeLessThan(20.5);
  });
});

describe('planQcInsertion', () => {
  it('keeps every field sample exactly once and adds one blank, one standard and one split per block of ten', () => {
    const order = plan();
    const samples = order.filter((item): item is Extract<PlannedItem, { kind: 'sample' }> => item.kind === 'sample').map((item) => item.sampleId);
    expect([...samples].sort()).toEqual(ids(20));
    expect(order.filter((item) => item.kind === 'blank')).toHaveLength(2);
    expect(order.filter((item) => item.kind === 'standard').map((item) => (item as { standardCode: string }).standardCode)).toEqual(['STD-A', 'STD-B']);
    expect(order.filter((item) => item.kind === 'split')).toHaveLength(2);
  });

  it('puts a blank within each block of field samples', () => {
    const order = plan({ sampleIds: ids(35), blankEvery: 5, standardEvery: 0, duplicateEvery: 0 });
    let fieldSeen = 0;
    const blanksAt: number[] = [];
    for (const item of order) {
      if (item.kind === 'sample') fieldSeen += 1;
      else blanksAt.push(fieldSeen);
    }
    expect(blanksAt).toHaveLength(7);
    blanksAt.forEach((seen, block) => {
      expect(seen).toBeGreaterThanOrEqual(block * 5);
      expect(seen).toBeLessThanOrEqual(block * 5 + 5);
    });
  });

  it('gives a short batch its blank and standard but no split below the duplicate rate', () => {
    const order = plan({ sampleIds: ids(3) });
    expect(order.map((item) => item.kind).sort()).toEqual(['blank', 'sample', 'sample', 'sample', 'standard']);
  });

  it('splits a sample of the batch, and the same seed gives the same plan', () => {
    const order = plan();
    const split = order.find((item) => item.kind === 'split') as { ofSampleId: string };
    expect(ids(20)).toContain(split.ofSampleId);
    expect(plan()).toEqual(order);
    expect(plan({ seed: 43 })).not.toEqual(order);
  });

  it('refuses an empty batch, repeated samples, negative rates and standards without codes, all at once', () => {
    const result = planQcInsertion({ sampleIds: [], blankEvery: -1, standardEvery: 2, duplicateEvery: 1.5, standardCodes: [], seed: 1 });
    expect(result.ok).toBe(false);
    expect(result.ok ? [] : result.errors.map((error) => error.field)).toEqual(['sampleIds', 'blankEvery', 'duplicateEvery', 'standardCodes']);
    const repeated = planQcInsertion({ sampleIds: ['a', 'a'], blankEvery: 0, standardEvery: 0, duplicateEvery: 0, standardCodes: [], seed: 1 });
    expect(repeated.ok ? [] : repeated.errors.map((error) => error.field)).toEqual(['sampleIds']);
  });
});
