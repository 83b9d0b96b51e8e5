/**
 * The sync protocol and its pure decisions, the one way into `shared/sync` for the client and the
 * server. See README.md for the rules.
 */
export * from './protocol';
export { classifyMutation, type Classification, type CurrentRecord } from './classify-mutation';
export { coalesceOutbox, type CoalescedOutbox, type PendingMutation } from './coalesce-outbox';
export { nextRetryDelay, RETRY_BASE_MS, RETRY_CAP_MS } from './next-retry-delay';
export { makeHumanCode, parseHumanCode, type HumanCodeParts } from './human-code';
