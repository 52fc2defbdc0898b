import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDigestTeam, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from '../store/index.js';
import { type ComposeDigest, createScheduler, type Deliver, type Scheduler } from './scheduler.js';

const MIN = 60_000;
const DAY = 24 * 60 * MIN;
const DAY0 = Date.parse('2026-06-01T00:00:00Z');
const DUE = Date.parse('2026-06-01T05:00:00Z'); // 07:00 Europe/Berlin, each day
const GRACE_MINUTES = 90;

const digest: ComposeDigest = (_s, team, now) => ({
  kind: 'digest',
  visibility: 'channel',
  headline: `${team.id} ${new Date(now).toISOString()}`,
});

type CrashKind = 'before-post' | 'after-post' | 'hang';

/**
 * A platform that, like a Discord channel with nonces, takes a message once per key. `received` counts every
 * message that reached it (a retry after a crash that came after the post shows up here twice).
 */
function platform() {
  const received = new Map<string, number>();
  const accept = (key: string) => received.set(key, (received.get(key) ?? 0) + 1);
  /** `crash` strikes from `crashAt` on (the process dies there); before that it posts normally. */
  const deliverFor =
    (crash: CrashKind | null, crashAt: number, now: () => number): Deliver =>
    (_t, _c, _r, meta) => {
      if (now() < crashAt) crash = null;
      if (crash === 'hang') return new Promise<void>(() => {});
      if (crash === 'before-post') throw new Error('process killed before the post');
      accept(meta.key);
      if (crash === 'after-post') throw new Error('process killed before recording the post');
    };
  return { received, deliverFor };
}

describe('exactly once across crashes and restarts at awkward moments (property)', () => {
  it('each day: one message under one key, whatever the crashes around the digest time', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(
          fc.array(
            fc.record({
              at: fc.integer({ min: -20, max: 20 }), // minutes from the digest time
              kind: fc.constantFrom<CrashKind>('before-post', 'after-post', 'hang'),
              downFor: fc.integer({ min: 1, max: 20 }), // minutes until the restart
            }),
            { maxLength: 2 },
          ),
          { minLength: 2, maxLength: 2 },
        ),
        async (crashesPerDay) => {
          const temp = tempStore();
          try {
            const first = temp.open();
            addDigestTeam(first, 'console:kv', 'Europe/Berlin', DAY0 - DAY);
            const { received, deliverFor } = platform();
            let store: Store = first;
            let t = 0;
            const start = (crash: CrashKind | null, crashAt = Number.POSITIVE_INFINITY): Scheduler =>
              createScheduler({
                store,
                deliver: deliverFor(crash, crashAt, () => t),
                clock: () => DAY0,
                graceMinutes: GRACE_MINUTES,
                composeDigest: digest,
                claimNotices: false,
              });
            let afterPostCrashes = 0;
            for (const [day, crashes] of crashesPerDay.entries()) {
              const due = DUE + day * DAY;
              const plan = [...crashes].sort((a, b) => a.at - b.at);
              t = due - 30 * MIN;
              for (const crash of plan) {
                const crashAt = Math.max(t, due + crash.at * MIN);
                const doomed = start(crash.kind, crashAt);
                for (; t < crashAt; t += 2 * MIN) await doomed.tick(t);
                // The doomed process's last tick: it dies inside `deliver` if a post is due now.
                t = crashAt;
                const last = doomed.tick(crashAt);
                if (crash.kind !== 'hang') await last.catch(() => {});
                if (crash.kind === 'after-post') afterPostCrashes++;
                store = temp.open(); // the restart opens the file afresh
                t = crashAt + crash.downFor * MIN;
              }
              const healthy = start(null);
              for (; t <= due + 60 * MIN; t += 2 * MIN) await healthy.tick(t);
              healthy.release();
              t = due + 60 * MIN;
            }
            expect([...received.keys()]).toEqual([
              'console:kv|ops|digest|2026-06-01',
              'console:kv|ops|digest|2026-06-02',
            ]);
            // A second arrival of a key only ever follows a crash between the post and its record.
            const repeats = [...received.values()].reduce((a, n) => a + (n - 1), 0);
            expect(repeats).toBeLessThanOrEqual(afterPostCrashes);
          } finally {
            temp.cleanup();
          }
        },
      ),
      { numRuns: 12 },
    );
  });
});
