import { describe, expect, it } from 'vitest';
import { oneAtATime } from './oneAtATime.js';

const busyFor = (ms: number) => {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    // a synchronous stretch of work, like a bot command on SQLite
  }
};

describe('oneAtATime', () => {
  it('runs jobs in order, one at a time, and keeps going after a failure', async () => {
    const queue = oneAtATime();
    const log: string[] = [];
    const job =
      (name: string, fail = false) =>
      async () => {
        log.push(`start ${name}`);
        await new Promise((resolve) => setTimeout(resolve, 5));
        log.push(`end ${name}`);
        if (fail) throw new Error(name);
        return name;
      };
    const results = await Promise.allSettled([
      queue.run(job('a')),
      queue.run(job('b', true)),
      queue.run(job('c')),
    ]);
    expect(log).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c']);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect(queue.pending).toBe(0);
  });

  it('lets a timer fire between two synchronous jobs', async () => {
    const queue = oneAtATime();
    const order: string[] = [];
    setTimeout(() => order.push('timer'), 0);
    await Promise.all([
      queue.run(async () => {
        busyFor(20);
        order.push('job 1');
      }),
      queue.run(async () => {
        busyFor(20);
        order.push('job 2');
      }),
    ]);
    expect(order.indexOf('timer')).toBeLessThan(order.indexOf('job 2'));
  });
});
