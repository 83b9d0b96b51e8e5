/**
 * The dispatch order of a lab batch with its QA/QC items (Abzalov 2008: insert field duplicates,
 * reference standards and blanks at set rates, and ship them blind so the lab cannot single them
 * out). The field samples are shuffled with a Fisher–Yates shuffle (Durstenfeld 1964; Knuth,
 * TAOCP vol. 2, §3.4.2, Algorithm P) driven by `seededRandom`, so the same seed always gives the
 * same order on every device and the server. Then, for every block of `blankEvery` field samples,
 * one blank goes at a random place within the block (likewise standards, cycling through the
 * chosen standards, and split duplicates of a random sample of the block). A partial last block
 * still gets its blank and standard: every batch carries at least one of each when asked for.
 */
import { seededRandom } from './random';
import { EngineError, Result, engineError, fail, ok } from './result';

/** One bag in dispatch order. */
export type PlannedItem =
  | { readonly kind: 'sample'; readonly sampleId: string }
  | { readonly kind: 'blank' }
  | { readonly kind: 'standard'; readonly standardCode: string }
  | { readonly kind: 'split'; readonly ofSampleId: string };

/** What to insert, and how often (one per that many field samples; 0 = none). */
export interface QcInsertionInput {
  readonly sampleIds: readonly string[];
  readonly blankEvery: number;
  readonly standardEvery: number;
  readonly duplicateEvery: number;
  readonly standardCodes: readonly string[];
  readonly seed: number;
}

/** Returns a copy of `items` in an order fully determined by `seed` (Fisher–Yates). */
export function seededShuffle<T>(items: readonly T[], seed: number): T[] {
  const random = seededRandom(seed);
  const shuffled = items.slice();
  for (let index = shuffled.length - 1; index > 0; index -= 1) {
    const other = Math.floor(random() * (index + 1));
    [shuffled[index], shuffled[other]] = [shuffled[other] as T, shuffled[index] as T];
  }
  return shuffled;
}

/** Plans the dispatch order: shuffled field samples with blanks, standards and split duplicates inserted. */
export function planQcInsertion(input: QcInsertionInput): Result<PlannedItem[]> {
  const errors: EngineError[] = [];
  if (input.sampleIds.length === 0) {
    errors.push(engineError('empty', 'sampleIds', 'a batch needs at least one field sample'));
  }
  if (new Set(input.sampleIds).size !== input.sampleIds.length) {
    errors.push(engineError('out-of-range', 'sampleIds', 'a sample can go into a batch only once'));
  }
  for (const field of ['blankEvery', 'standardEvery', 'duplicateEvery'] as const) {
    const value = input[field];
    if (!Number.isInteger(value) || value < 0) {
      errors.push(engineError('out-of-range', field, `${field} must be a whole number, 0 for none (got ${String(value)})`));
    }
  }
  if (input.standardEvery > 0 && input.standardCodes.length === 0) {
    errors.push(engineError('missing', 'standardCodes', 'choose the reference standards to insert'));
  }
  if (!Number.isInteger(input.seed)) {
    errors.push(engineError('not-a-number', 'seed', 'the seed must be a whole number'));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const random = seededRandom(input.seed);
  const samples = seededShuffle(input.sampleIds, input.seed);
  // Inserted items hang after a field sample's index (-1 = before the first); ties keep insertion order.
  const inserted: { readonly after: number; readonly item: PlannedItem }[] = [];
  const insertPerBlock = (every: number, makeItem: (block: readonly string[], blockIndex: number) => PlannedItem) => {
    if (every === 0) return;
    for (let start = 0, blockIndex = 0; start < samples.length; start += every, blockIndex += 1) {
      const block = samples.slice(start, start + every);
      const after = start - 1 + Math.floor(random() * (block.length + 1));
      inserted.push({ after, item: makeItem(block, blockIndex) });
    }
  };
  insertPerBlock(input.blankEvery, () => ({ kind: 'blank' }));
  insertPerBlock(input.standardEvery, (_block, blockIndex) => ({ kind: 'standard', standardCode: input.standardCodes[blockIndex % input.standardCodes.length] as string }));
  if (input.duplicateEvery > 0) {
    // Splits only for full blocks: a duplicate every N means none for fewer than N samples.
    for (let start = 0; start + input.duplicateEvery <= samples.length; start += input.duplicateEvery) {
      const block = samples.slice(start, start + input.duplicateEvery);
      const ofSampleId = block[Math.floor(random() * block.length)] as string;
      const after = start - 1 + Math.floor(random() * (block.length + 1));
      inserted.push({ after, item: { kind: 'split', ofSampleId } });
    }
  }
  const order: PlannedItem[] = inserted.filter((entry) => entry.after === -1).map((entry) => entry.item);
  samples.forEach((sampleId, index) => {
    order.push({ kind: 'sample', sampleId });
    order.push(...inserted.filter((entry) => entry.after === index).map((entry) => entry.item));
  });
  return ok(order);
}
