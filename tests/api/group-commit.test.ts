import { describe, expect, it } from 'vitest';
import { groupCommit } from '../../api/lib/group-commit';

/** A write the test finishes by hand, recording each group it was given. */
function controlledWrite() {
  const groups: string[][] = [];
  const finishers: Array<(results: PromiseSettledResult<string>[]) => void> = [];
  const failers: Array<(error: Error) => void> = [];
  const write = (items: string[]) => {
    groups.push(items);
    return new Promise<PromiseSettledResult<string>[]>((resolve, reject) => {
      finishers.push(resolve);
      failers.push(reject);
    });
  };
  const done = (index: number) =>
    finishers[index]!(groups[index]!.map((item) => ({ status: 'fulfilled', value: `stored ${item}` })));
  return { groups, write, done, fail: (index: number, error: Error) => failers[index]!(error), finishers };
}

const settle = () => new Promise((resolve) => setImmediate(resolve));

describe('group commit', () => {
  it('writes an item at once when nothing else is being written', async () => {
    const { groups, write, done } = controlledWrite();
    const submit = groupCommit(write, { maxInFlight: 1, maxSize: 10, sizeOf: () => 1 });

    const answer = submit('a');
    await settle();

    expect(groups).toEqual([['a']]);
    done(0);
    await expect(answer).resolves.toBe('stored a');
  });

  it('gathers what arrives while writes are running into the next group, each answered in turn', async () => {
    const { groups, write, done } = controlledWrite();
    const submit = groupCommit(write, { maxInFlight: 2, maxSize: 10, sizeOf: () => 1 });

    const answers = ['a', 'b', 'c', 'd', 'e'].map((item) => submit(item));
    await settle();
    expect(groups).toEqual([['a'], ['b']]);

    done(1);
    await settle();
    expect(groups).toEqual([['a'], ['b'], ['c', 'd', 'e']]);
    done(0);
    done(2);

    await expect(Promise.all(answers)).resolves.toEqual(
      ['a', 'b', 'c', 'd', 'e'].map((item) => `stored ${item}`),
    );
  });

  it('closes a group before its sizes pass the limit, and sends a larger item alone', async () => {
    const { groups, write, done } = controlledWrite();
    const sizes: Record<string, number> = { first: 1, a: 2, b: 2, c: 2, big: 9, d: 1 };
    const submit = groupCommit(write, { maxInFlight: 1, maxSize: 5, sizeOf: (item) => sizes[item]! });

    const answers = ['first', 'a', 'b', 'c', 'big', 'd'].map((item) => submit(item));
    for (let index = 0; index < 5; index += 1) {
      await settle();
      done(index);
    }
    await Promise.all(answers);

    expect(groups).toEqual([['first'], ['a', 'b'], ['c'], ['big'], ['d']]);
  });

  it('fails only the group whose write throws, and goes on with the next', async () => {
    const { groups, write, done, fail } = controlledWrite();
    const submit = groupCommit(write, { maxInFlight: 1, maxSize: 10, sizeOf: () => 1 });

    const first = submit('a');
    const waiting = [submit('b'), submit('c')];
    await settle();
    fail(0, new Error('database went away'));
    await expect(first).rejects.toThrow('database went away');
    await settle();
    expect(groups).toEqual([['a'], ['b', 'c']]);
    done(1);

    await expect(Promise.all(waiting)).resolves.toEqual(['stored b', 'stored c']);
  });

  it('hands each item its own outcome when the write settles them one by one', async () => {
    const { groups, write, finishers } = controlledWrite();
    const submit = groupCommit(write, { maxInFlight: 1, maxSize: 10, sizeOf: () => 1 });

    const blocker = submit('first');
    const answers = [submit('good'), submit('bad')];
    await settle();
    finishers[0]!([{ status: 'fulfilled', value: 'stored first' }]);
    await blocker;
    await settle();
    expect(groups[1]).toEqual(['good', 'bad']);
    finishers[1]!([
      { status: 'fulfilled', value: 'stored good' },
      { status: 'rejected', reason: new Error('tank is gone') },
    ]);

    await expect(answers[0]).resolves.toBe('stored good');
    await expect(answers[1]).rejects.toThrow('tank is gone');
  });
});
