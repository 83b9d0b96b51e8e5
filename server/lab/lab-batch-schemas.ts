import { z } from 'zod';

/** Longest list of samples one batch takes (a lab's rack is usually well below this). */
export const MAX_BATCH_SAMPLES = 500;

const text = (max: number) => z.string().trim().min(1).max(max);
const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();

/** `POST /api/lab-batches`: which samples go, with which QA/QC, to which lab and method. */
export const createBatchSchema = z
  .object({
    siteId: z.uuid(),
    sampleIds: z.array(z.uuid()).min(1).max(MAX_BATCH_SAMPLES),
    labName: text(200),
    labContactEmail: z.email().max(320),
    method: text(120),
    chargeMassG: z.number().positive().max(10_000),
    detectionLimitGpt: z.number().positive().max(100),
    upperLimitGpt: z.number().positive().max(100_000).nullable().default(null),
    isBlind: z.boolean().default(true),
    blankEvery: z.number().int().min(0).max(MAX_BATCH_SAMPLES).default(20),
    standardEvery: z.number().int().min(0).max(MAX_BATCH_SAMPLES).default(20),
    duplicateEvery: z.number().int().min(0).max(MAX_BATCH_SAMPLES).default(20),
    standardCodes: z.array(text(64)).max(20).default([]),
    seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
    notes: z.string().max(2000).default(''),
  })
  .strict()
  .refine((batch) => batch.upperLimitGpt === null || batch.upperLimitGpt > batch.detectionLimitGpt, {
    path: ['upperLimitGpt'], message: 'The upper limit must be above the detection limit',
  });
export type CreateBatchInput = z.infer<typeof createBatchSchema>;

/** `PATCH /api/lab-batches/:id/custody`: chain-of-custody fields (only those given change). */
export const custodySchema = z
  .object({
    dispatchedBy: optionalText(200),
    dispatchedAt: z.iso.datetime({ offset: true }).nullable().optional(),
    carrier: optionalText(200),
    sealNumbers: optionalText(500),
    receivedBy: optionalText(200),
    receivedAt: z.iso.datetime({ offset: true }).nullable().optional(),
    conditionOnReceipt: optionalText(500),
  })
  .strict();
export type CustodyInput = z.infer<typeof custodySchema>;

/** The fields a lab user may fill in: the receiving end of the chain of custody. */
export const LAB_CUSTODY_FIELDS = ['receivedBy', 'receivedAt', 'conditionOnReceipt'] as const;

export const batchIdParams = z.strictObject({ id: z.uuid() });
export const listBatchesQuery = z.strictObject({ siteId: z.uuid().optional() });
export const siteQuery = z.strictObject({ siteId: z.uuid() });
export const resultsQuery = z.strictObject({ dryRun: z.enum(['true', 'false']).default('true') });
