import { describe, expect, it } from 'vitest';
import { createTurns } from './turns.js';

describe('createTurns', () => {
  it('runs jobs one at a time in order, and a failure does not stop the next', async () => {
    const take = createTurns();
    const log: string[] = [];
    const a = take(async () => {
      log.push('a start');
      await new Promise((r) => setTimeout(r, 20));
      log.push('a end');
      return 1;
    });
    const b = take(() => {
      log.push('b');
      throw new Error('boom');
    });
    const c = take(() => {
      log.push('c');
      return 3;
    });
    expect(await a).toBe(1);
    await expect(b).rejects.toThrow('boom');
    expect(await c).toBe(3);
    expect(log).toEqual(['a start', 'a end', 'b', 'c']);
  });

  it('lets waiting I/O run between two jobs', async () => {
    const take = createTurns();
    const log: string[] = [];
    const busy = (name: string) => () => {
      log.push(name);
      const until = Date.now() + 5;
      while (Date.now() < until) {} // synchronous work, like a SQLite transaction
    };
    const first = take(busy('job 1'));
    const second = take(busy('job 2'));
    setTimeout(() => log.push('timer'), 0); // stands for an incoming request waiting on the loop
    await Promise.all([first, second]);
    expect(log.indexOf('timer')).toBeLessThan(log.indexOf('job 2'));
  });
});
