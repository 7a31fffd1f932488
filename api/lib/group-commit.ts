/**
 * Group commit: items that arrive while earlier groups are being written wait, and go together in
 * the next write, so many small writes share one statement and one commit. An item arriving when
 * fewer than `maxInFlight` writes are running is written at once: nothing waits on a timer, and a
 * quiet system writes each item alone, as soon as it comes.
 */
export interface GroupCommitOptions<I> {
  /** How many groups may be written at the same time. */
  maxInFlight: number;
  /** A group stops growing before its items' sizes pass this (a first item larger goes alone). */
  maxSize: number;
  sizeOf(item: I): number;
}

/**
 * `write` gets a group and answers, in the group's order, how each item ended; when it throws,
 * every item of the group fails with that error. Returns the function that submits one item.
 */
export function groupCommit<I, O>(
  write: (items: I[]) => Promise<PromiseSettledResult<O>[]>,
  options: GroupCommitOptions<I>,
): (item: I) => Promise<O> {
  interface Waiting {
    item: I;
    resolve(value: O): void;
    reject(reason: unknown): void;
  }
  const waiting: Waiting[] = [];
  let inFlight = 0;

  const pump = () => {
    while (inFlight < options.maxInFlight && waiting.length > 0) {
      const group = [waiting.shift()!];
      let size = options.sizeOf(group[0]!.item);
      while (waiting.length > 0 && size + options.sizeOf(waiting[0]!.item) <= options.maxSize) {
        const next = waiting.shift()!;
        size += options.sizeOf(next.item);
        group.push(next);
      }
      inFlight += 1;
      write(group.map((entry) => entry.item))
        .then(
          (results) =>
            group.forEach((entry, index) => {
              const result = results[index];
              if (result?.status === 'fulfilled') entry.resolve(result.value);
              else entry.reject(result ? result.reason : new Error('group write gave no result for an item'));
            }),
          (error: unknown) => group.forEach((entry) => entry.reject(error)),
        )
        .finally(() => {
          inFlight -= 1;
          pump();
        });
    }
  };

  return (item) =>
    new Promise<O>((resolve, reject) => {
      waiting.push({ item, resolve, reject });
      pump();
    });
}
