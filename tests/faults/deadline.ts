/**
 * Polls `check` until it returns a value other than undefined/false, or fails
 * with `what` once `ms` have passed: the tests wait for an outcome with a
 * deadline instead of sleeping for a guessed time.
 */
export async function eventually<T>(what: string, ms: number, check: () => Promise<T | undefined | false>, everyMs = 200): Promise<T> {
  const end = Date.now() + ms;
  let last: unknown;
  for (;;) {
    try {
      const value = await check();
      if (value !== undefined && value !== false) return value;
    } catch (err) {
      last = err;
    }
    if (Date.now() > end) throw new Error(`gave up after ${ms / 1000} s waiting until ${what}${last ? ` (last error: ${String(last)})` : ''}`);
    await new Promise((resolve) => setTimeout(resolve, everyMs));
  }
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
