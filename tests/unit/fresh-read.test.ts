import { describe, expect, it } from 'vitest';
import { freshRead } from '~/lib/server/fresh-read';

/** A reading of `world.value` that ends when the test says so, counting readings started and in flight. */
function controlledReader() {
  const world = { value: 0, started: 0, inFlight: 0, maxInFlight: 0 };
  const pending: { finish: () => void; fail: (error: Error) => void }[] = [];
  const read = () =>
    new Promise<number>((resolve, reject) => {
      world.started += 1;
      world.inFlight += 1;
      world.maxInFlight = Math.max(world.maxInFlight, world.inFlight);
      const valueAtStart = world.value;
      pending.push({
        finish: () => {
          world.inFlight -= 1;
          resolve(valueAtStart);
        },
        fail: (error) => {
          world.inFlight -= 1;
          reject(error);
        },
      });
    });
  const settle = async (how: 'finish' | 'fail' = 'finish') => {
    const next = pending.shift()!;
    if (how === 'finish') next.finish();
    else next.fail(new Error('the database went away'));
    // Let the promise chains run.
    for (let i = 0; i < 10; i += 1) await Promise.resolve();
  };
  return { world, read, settle };
}

describe('freshRead', () => {
  it('never answers with a reading started before the caller asked, and keeps one reading in flight', async () => {
    const { world, read, settle } = controlledReader();
    const version = freshRead(read);
    const first = version();
    world.value = 1; // a write commits while the first reading is in flight
    const second = version();
    const third = version();
    await settle();
    expect(await first).toBe(0);
    await settle();
    // Both asked after the write: the reading they share started after them, so it sees it.
    expect(await second).toBe(1);
    expect(await third).toBe(1);
    expect(world.started).toBe(2);
    expect(world.maxInFlight).toBe(1);
  });

  it('reads again for a caller who asks once nothing is in flight', async () => {
    const { world, read, settle } = controlledReader();
    const version = freshRead(read);
    const first = version();
    await settle();
    expect(await first).toBe(0);
    world.value = 2;
    const later = version();
    await settle();
    expect(await later).toBe(2);
    expect(world.started).toBe(2);
  });

  it('fails the callers who shared a failed reading, and the next caller reads afresh', async () => {
    const { read, settle } = controlledReader();
    const version = freshRead(read);
    const failing = version();
    const waiting = version();
    await settle('fail');
    await expect(failing).rejects.toThrow('the database went away');
    await settle('fail');
    await expect(waiting).rejects.toThrow('the database went away');
    const retry = version();
    await settle();
    expect(await retry).toBe(0);
  });
});
