/**
 * Runs tasks one at a time per key (here: per consultation), in the order they were queued.
 * Chat sends take their sequence number and broadcast inside one task, so this process emits a
 * thread's messages in sequence order even with many senders at once. (Across several server
 * processes the database still orders the numbers; clients also sort by sequence.)
 */
export function createKeyedSequencer() {
  const tails = new Map<string, Promise<unknown>>();
  return function runInOrder<T>(key: string, task: () => Promise<T>): Promise<T> {
    const previous = tails.get(key) ?? Promise.resolve();
    const run = previous.then(task, task);
    const tail = run.catch(() => undefined);
    tails.set(key, tail);
    void tail.then(() => {
      if (tails.get(key) === tail) tails.delete(key);
    });
    return run;
  };
}
export type RunInOrder = ReturnType<typeof createKeyedSequencer>;
