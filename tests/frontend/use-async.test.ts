import { describe, expect, it } from 'vitest';
import { ApiError } from '@/api/errors';
import { useAsync } from '@/composables/useAsync';

function deferred<T>() {
  let resolve!: (value: T) => void;
  let reject!: (error: unknown) => void;
  const promise = new Promise<T>((ok, fail) => {
    resolve = ok;
    reject = fail;
  });
  return { promise, resolve, reject };
}

describe('useAsync', () => {
  it('when a task runs, then loading is on until it ends and the data is kept', async () => {
    const pending = deferred<number>();
    const task = useAsync(() => pending.promise);
    const running = task.run();
    expect(task.loading.value).toBe(true);
    pending.resolve(42);
    await running;
    expect(task.loading.value).toBe(false);
    expect(task.data.value).toBe(42);
    expect(task.error.value).toBeNull();
  });

  it('when a task fails, then the error is kept as an ApiError and loading ends', async () => {
    const task = useAsync(async () => {
      throw new ApiError(409, 'conflict', 'That name is taken; choose another.', 'name');
    });
    expect(await task.run()).toBeNull();
    expect(task.loading.value).toBe(false);
    expect(task.error.value).toMatchObject({ status: 409, code: 'conflict', field: 'name' });
  });

  it('when a second call overtakes the first, then only the latest result is kept', async () => {
    const first = deferred<string>();
    const second = deferred<string>();
    const task = useAsync((which: 'first' | 'second') => (which === 'first' ? first.promise : second.promise));
    const slow = task.run('first');
    const fast = task.run('second');
    second.resolve('second');
    await fast;
    first.resolve('first');
    await slow;
    expect(task.data.value).toBe('second');
    expect(task.loading.value).toBe(false);
  });
});
