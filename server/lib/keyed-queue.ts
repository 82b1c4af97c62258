/**
 * One call at a time per key, in arrival order, within this process: `run(key, fn)` starts `fn`
 * once every earlier call with the same key has settled (whether it succeeded or failed).
 *
 * Readings of one run take turns here, so while one is stored the others wait in memory instead
 * of each holding one of the pool's connections while PostgreSQL makes it wait for the run's
 * row. Other requests (the health check, lists) then always find a free connection. Several
 * server processes each keep their own turns; the row lock still orders them between processes,
 * with at most one waiting connection per process and run.
 */
export type KeyedQueue = {
  run<T>(key: string, fn: () => Promise<T>): Promise<T>;
  /** Keys with a call running or waiting: none once every call has settled (idle keys are forgotten). */
  readonly size: number;
};

export function createKeyedQueue(): KeyedQueue {
  const tails = new Map<string, Promise<unknown>>();
  return {
    run<T>(key: string, fn: () => Promise<T>): Promise<T> {
      const before = tails.get(key) ?? Promise.resolve();
      const result = before.then(fn);
      const tail = result.then(
        () => undefined,
        () => undefined,
      );
      tails.set(key, tail);
      void tail.then(() => {
        if (tails.get(key) === tail) tails.delete(key);
      });
      return result;
    },
    get size() {
      return tails.size;
    },
  };
}
