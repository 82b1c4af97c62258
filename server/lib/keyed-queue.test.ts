import { describe, expect, it } from 'vitest';
import { createKeyedQueue } from './keyed-queue';

const tick = () => new Promise((r) => setTimeout(r, 5));

describe('createKeyedQueue', () => {
  it('runs calls with the same key one at a time, in arrival order', async () => {
    const q = createKeyedQueue();
    const log: string[] = [];
    let running = 0;
    let most = 0;
    const job = (name: string) => async () => {
      running += 1;
      most = Math.max(most, running);
      log.push(`start ${name}`);
      await tick();
      log.push(`end ${name}`);
      running -= 1;
      return name;
    };
    const results = await Promise.all([q.run('run-1', job('a')), q.run('run-1', job('b')), q.run('run-1', job('c'))]);
    expect(results).toEqual(['a', 'b', 'c']);
    expect(most).toBe(1);
    expect(log).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c']);
  });

  it('lets different keys run side by side', async () => {
    const q = createKeyedQueue();
    let running = 0;
    let most = 0;
    const job = async () => {
      running += 1;
      most = Math.max(most, running);
      await tick();
      running -= 1;
    };
    await Promise.all([q.run('run-1', job), q.run('run-2', job), q.run('run-3', job)]);
    expect(most).toBe(3);
  });

  it('goes on after a failed call, which fails alone, and forgets idle keys', async () => {
    const q = createKeyedQueue();
    const failed = q.run('run-1', () => Promise.reject(new Error('refused')));
    const next = q.run('run-1', () => Promise.resolve('stored'));
    await expect(failed).rejects.toThrow('refused');
    await expect(next).resolves.toBe('stored');
    await tick();
    expect(q.size).toBe(0);
  });

  it('a call that throws before returning a promise still leaves the queue usable', async () => {
    const q = createKeyedQueue();
    const bad = q.run('k', () => {
      throw new Error('at once');
    });
    await expect(bad).rejects.toThrow('at once');
    await expect(q.run('k', () => Promise.resolve(1))).resolves.toBe(1);
  });
});
