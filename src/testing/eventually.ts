/**
 * Waits until `read` returns something other than null/undefined, checking on every macrotask.
 * For specs whose component finishes on work jsdom does asynchronously (a FileReader, IndexedDB),
 * where a fixed sleep passes on a quiet machine and fails on a loaded CI runner.
 */
export async function eventually<T>(read: () => T | null | undefined | Promise<T | null | undefined>, timeoutMs = 5000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (value !== null && value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`eventually: nothing after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
