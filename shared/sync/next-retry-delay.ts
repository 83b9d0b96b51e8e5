/** First wait after a failed sync (ms). */
export const RETRY_BASE_MS = 2_000;
/**
 * Longest wait between attempts (ms). Five minutes keeps a phone at camp from hammering a weak
 * link while still syncing within minutes of the link coming back.
 */
export const RETRY_CAP_MS = 300_000;

/**
 * The wait before retry number `attempt` (1 for the first retry): exponential back-off with "full
 * jitter" (a uniform draw between half the exponential step and the step, capped), so many devices
 * at one camp do not retry in lock-step. `random` is a draw in [0, 1), passed in to keep this pure.
 */
export function nextRetryDelay(attempt: number, random: number): number {
  if (!Number.isInteger(attempt) || attempt < 1) {
    throw new RangeError(`attempt must be a positive integer, got ${attempt}`);
  }
  const draw = Math.min(Math.max(random, 0), 1);
  // 2^attempt overflows to Infinity far beyond the cap, which Math.min then clamps.
  const step = Math.min(RETRY_CAP_MS, RETRY_BASE_MS * 2 ** (attempt - 1));
  return Math.round(step / 2 + (step / 2) * draw);
}
