import { DateTime } from 'luxon';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addDigestTeam, recordingSink, type TempStore, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from '../store/index.js';
import {
  type ComposeDigest,
  createScheduler,
  type ScheduleEvent,
  type SchedulerOptions,
} from './scheduler.js';

// The composer is injected so these tests look at timing and exactly-once alone; digest.test.ts checks content.
const headlineDigest: ComposeDigest = (_store, team, now) => ({
  kind: 'digest',
  visibility: 'channel',
  headline: `digest for ${team.id} built ${new Date(now).toISOString()}`,
});

const MIN = 60_000;
const HOUR = 60 * MIN;
const utc = (iso: string) => Date.parse(iso);

/** Long simulations tick within the lease so it is renewed, not retaken, on most ticks (as the real loop does). */
const longRun = { leaseTtlMs: 6 * HOUR };

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
});
afterEach(() => temp.cleanup());

function scheduler(s: Store, sinkNow: { value: number }, extra: Partial<SchedulerOptions> = {}) {
  const sink = recordingSink(() => sinkNow.value);
  const events: ScheduleEvent[] = [];
  const sch = createScheduler({
    store: s,
    deliver: sink.deliver,
    clock: () => sinkNow.value,
    graceMinutes: 60,
    composeDigest: headlineDigest,
    log: (e) => events.push(e),
    ...extra,
  });
  return { sch, posted: sink.posted, events };
}

/** Ticks every `step` from `from` to `to` (inclusive), keeping `clock.value` at the tick's time. */
async function run(
  sch: { tick(now?: number): Promise<unknown> },
  clock: { value: number },
  from: number,
  to: number,
  step: number,
) {
  for (let t = from; t <= to; t += step) {
    clock.value = t;
    await sch.tick(t);
  }
}

describe('a digest a day across the daylight-saving changes', () => {
  // Dates of the changes: IANA time zone database as shipped with Node's ICU (see local-time.test.ts).
  const zones = [
    ['console:chicago', 'America/Chicago'],
    ['console:berlin', 'Europe/Berlin'],
    ['console:sydney', 'Australia/Sydney'],
  ] as const;

  it.each([
    ['spring in the north, autumn in Sydney', '2026-03-01T00:00:00Z', '2026-04-10T00:00:00Z'],
    ['autumn in the north, spring in Sydney', '2026-09-28T00:00:00Z', '2026-11-05T00:00:00Z'],
  ])('%s: exactly one digest per local day, at 07:00 local', async (_name, fromIso, toIso) => {
    const from = utc(fromIso);
    const to = utc(toIso);
    for (const [id, zone] of zones) addDigestTeam(store, id, zone, from - 7 * 24 * HOUR);
    const clock = { value: from };
    const { sch, posted } = scheduler(store, clock, longRun);
    await run(sch, clock, from, to, 30 * MIN);

    for (const [id, zone] of zones) {
      const mine = posted.filter((p) => p.team === id);
      const dates = mine.map((p) => DateTime.fromMillis(p.at, { zone }).toISODate());
      expect(new Set(dates).size).toBe(dates.length); // never two on one local day
      // Every local day in the window whose 07:00 fell inside it got one.
      const first = DateTime.fromMillis(from, { zone }).startOf('day');
      let expected = 0;
      for (let day = first; day.toMillis() < to; day = day.plus({ days: 1 })) {
        const at = day.set({ hour: 7 }).toMillis();
        if (at >= from && at <= to) expected++;
      }
      expect(mine.length).toBe(expected);
      // The 30-minute UTC grid meets 07:00 local exactly (whole-hour offsets), so each fired at 07:00 sharp.
      for (const p of mine) expect(DateTime.fromMillis(p.at, { zone }).toFormat('HH:mm')).toBe('07:00');
    }
  });

  it('a digest set at a time the spring change skips posts once, at the next valid minute', async () => {
    const from = utc('2026-03-06T00:00:00Z');
    addDigestTeam(store, 'console:chicago', 'America/Chicago', from, '02:30');
    const clock = { value: from };
    const { sch, posted } = scheduler(store, clock);
    await run(sch, clock, from, utc('2026-03-11T00:00:00Z'), 10 * MIN);
    const local = posted.map((p) =>
      DateTime.fromMillis(p.at, { zone: 'America/Chicago' }).toFormat('yyyy-MM-dd HH:mm'),
    );
    expect(local).toEqual([
      '2026-03-06 02:30',
      '2026-03-07 02:30',
      '2026-03-08 03:00',
      '2026-03-09 02:30',
      '2026-03-10 02:30',
    ]);
  });

  it('a digest set at a time the autumn change repeats posts once, at the first occurrence', async () => {
    const from = utc('2026-10-31T00:00:00Z');
    addDigestTeam(store, 'console:chicago', 'America/Chicago', from, '01:30');
    const clock = { value: from };
    const { sch, posted } = scheduler(store, clock);
    await run(sch, clock, from, utc('2026-11-03T00:00:00Z'), 10 * MIN);
    const at = posted.map((p) => new Date(p.at).toISOString());
    // 01:30 CDT (UTC-5) on 1 November, not 01:30 CST an hour later.
    expect(at).toEqual(['2026-10-31T06:30:00.000Z', '2026-11-01T06:30:00.000Z', '2026-11-02T07:30:00.000Z']);
  });

  it('weekday digests skip the weekend', async () => {
    const from = utc('2026-03-02T00:00:00Z'); // a Monday
    addDigestTeam(store, 'console:berlin', 'Europe/Berlin', from, '07:00', [1, 2, 3, 4, 5]);
    const clock = { value: from };
    const { sch, posted } = scheduler(store, clock, longRun);
    await run(sch, clock, from, utc('2026-03-16T00:00:00Z'), 30 * MIN);
    const weekdays = posted.map((p) => DateTime.fromMillis(p.at, { zone: 'Europe/Berlin' }).weekday);
    expect(weekdays).toEqual([1, 2, 3, 4, 5, 1, 2, 3, 4, 5]);
  });
});

describe('downtime and crashes', () => {
  const zone = 'Europe/Berlin';
  const day0 = utc('2026-06-01T00:00:00Z');
  const due = utc('2026-06-01T05:00:00Z'); // 07:00 CEST
  beforeEach(() => addDigestTeam(store, 'console:kv', zone, day0));

  it('a digest missed by less than the grace period posts once on restart', async () => {
    const clock = { value: day0 };
    const first = scheduler(store, clock);
    await run(first.sch, clock, due - 20 * MIN, due - 10 * MIN, 5 * MIN);
    // Down from 06:50 to 07:25 local; the lease of the dead process has expired by then.
    const second = scheduler(temp.open(), clock);
    await run(second.sch, clock, due + 25 * MIN, due + 2 * HOUR, 5 * MIN);
    expect(first.posted).toHaveLength(0);
    expect(second.posted.map((p) => p.at)).toEqual([due + 25 * MIN]);
  });

  it('a digest missed by more than the grace period is skipped and logged once, and the next day is normal', async () => {
    const clock = { value: day0 };
    const later = scheduler(store, clock);
    await run(later.sch, clock, due + 90 * MIN, due + 24 * HOUR + 30 * MIN, 5 * MIN);
    expect(later.posted.map((p) => p.at)).toEqual([due + 24 * HOUR]);
    const skipped = later.events.filter((e) => e.type === 'skipped');
    expect(skipped).toHaveLength(1);
    expect(skipped[0]).toMatchObject({ post: { key: '2026-06-01' }, dueAt: due });
  });

  it('a crash while delivering (the platform never got it) is retried once by the next process', async () => {
    const clock = { value: day0 };
    const dying = createScheduler({
      store,
      clock: () => clock.value,
      graceMinutes: 60,
      composeDigest: headlineDigest,
      deliver: () => {
        throw new Error('process killed mid-post');
      },
    });
    clock.value = due;
    await dying.tick(due);
    const next = scheduler(temp.open(), clock);
    await run(next.sch, clock, due + 1 * MIN, due + 3 * HOUR, MIN);
    expect(next.posted).toHaveLength(1);
    // The message is the one claimed at 07:00, not rebuilt later.
    expect(next.posted[0]?.replies[0]?.headline).toContain(new Date(due).toISOString());
    expect(next.posted[0]?.at).toBe(due + 2 * MIN); // as soon as the dead holder's 2-minute lease lapsed
  });

  it('a crash that hangs after the claim is taken over once the lease lapses, and posted once', async () => {
    const clock = { value: day0 };
    const hanging = createScheduler({
      store,
      clock: () => clock.value,
      graceMinutes: 60,
      composeDigest: headlineDigest,
      deliver: () => new Promise<void>(() => {}),
    });
    clock.value = due;
    void hanging.tick(due); // never finishes: the process froze here
    const next = scheduler(temp.open(), clock);
    await run(next.sch, clock, due, due + 3 * HOUR, MIN);
    expect(next.posted).toHaveLength(1);
    expect(next.events.some((e) => e.type === 'not-leader')).toBe(true);
  });

  it('a crash after the platform took the message retries under the same key, so a deduplicating sink posts once', async () => {
    const clock = { value: day0 };
    const seen = new Map<string, number>();
    const dedupingSink =
      (crashAfterPost: boolean) => (_t: string, _c: string, _r: unknown, meta: { key: string }) => {
        seen.set(meta.key, (seen.get(meta.key) ?? 0) + 1);
        if (crashAfterPost) throw new Error('killed before recording the delivery');
      };
    const dying = createScheduler({
      store,
      clock: () => clock.value,
      graceMinutes: 60,
      composeDigest: headlineDigest,
      deliver: dedupingSink(true),
    });
    await dying.tick(due);
    const next = createScheduler({
      store: temp.open(),
      clock: () => clock.value,
      graceMinutes: 60,
      composeDigest: headlineDigest,
      deliver: dedupingSink(false),
    });
    await run(next, clock, due + MIN, due + 2 * HOUR, MIN);
    expect([...seen.keys()]).toHaveLength(1); // one key: a platform nonce turns the retry into a no-op
    expect([...seen.values()]).toEqual([2]);
  });

  it('a restart just after a delivered digest does not repeat it', async () => {
    const clock = { value: day0 };
    const first = scheduler(store, clock);
    await run(first.sch, clock, due - 5 * MIN, due + 5 * MIN, 5 * MIN);
    first.sch.release(); // clean shutdown
    const second = scheduler(temp.open(), clock);
    await run(second.sch, clock, due + 6 * MIN, due + 3 * HOUR, 5 * MIN);
    expect(first.posted).toHaveLength(1);
    expect(second.posted).toHaveLength(0);
  });

  it('a delivery that keeps failing is expired after the grace period, and logged', async () => {
    const clock = { value: day0 };
    const events: ScheduleEvent[] = [];
    const failing = createScheduler({
      store,
      clock: () => clock.value,
      graceMinutes: 30,
      composeDigest: headlineDigest,
      deliver: () => Promise.reject(new Error('channel not found')),
      log: (e) => events.push(e),
    });
    await run(failing, clock, due, due + 2 * HOUR, 10 * MIN);
    expect(events.filter((e) => e.type === 'delivery-failed')).toHaveLength(4); // 07:00, :10, :20, :30
    expect(events.filter((e) => e.type === 'expired')).toHaveLength(1);
  });
});

describe('two schedulers on one store', () => {
  it('post each digest once, whichever holds the lease', async () => {
    const from = utc('2026-06-01T00:00:00Z');
    addDigestTeam(store, 'console:kv', 'America/Chicago', from);
    addDigestTeam(store, 'console:ridge', 'Australia/Sydney', from);
    const clock = { value: from };
    const a = scheduler(store, clock);
    const b = scheduler(temp.open(), clock);
    for (let t = from; t <= from + 5 * 24 * HOUR; t += 10 * MIN) {
      clock.value = t;
      await Promise.all([a.sch.tick(t), b.sch.tick(t)]);
    }
    const all = [...a.posted, ...b.posted];
    expect(all).toHaveLength(10);
    expect(new Set(all.map((p) => p.meta.key)).size).toBe(10);
    expect(b.posted).toHaveLength(0); // a took the lease first and kept renewing it
  });

  it('post once even when the lease flips between them every tick', async () => {
    const from = utc('2026-06-01T00:00:00Z');
    addDigestTeam(store, 'console:kv', 'Europe/Berlin', from);
    const clock = { value: from };
    const a = scheduler(store, clock, { leaseTtlMs: 1 });
    const b = scheduler(temp.open(), clock, { leaseTtlMs: 1 });
    let turn = 0;
    for (let t = from; t <= from + 4 * 24 * HOUR; t += 5 * MIN) {
      clock.value = t;
      await (turn++ % 2 === 0 ? a : b).sch.tick(t);
    }
    const all = [...a.posted, ...b.posted];
    expect(all.map((p) => p.meta.key)).toEqual([
      'console:kv|ops|digest|2026-06-01',
      'console:kv|ops|digest|2026-06-02',
      'console:kv|ops|digest|2026-06-03',
      'console:kv|ops|digest|2026-06-04',
    ]);
  });
});

describe('bad data never stops the scheduler', () => {
  const from = utc('2026-06-01T00:00:00Z');
  const due = utc('2026-06-01T05:00:00Z'); // 07:00 in Europe/Berlin

  it('a team whose digest cannot be built is logged; the other teams still get theirs', async () => {
    addDigestTeam(store, 'console:broken', 'Europe/Berlin', from);
    addDigestTeam(store, 'console:kv', 'Europe/Berlin', from);
    const clock = { value: due };
    const { sch, posted, events } = scheduler(store, clock, {
      composeDigest: (s, team, now, since) => {
        if (team.id === 'console:broken') throw new Error('tank 7 has a corrupt shape');
        return headlineDigest(s, team, now, since);
      },
    });
    await sch.tick(due);
    expect(posted.map((p) => p.team)).toEqual(['console:kv']);
    expect(events).toContainEqual({
      type: 'compose-failed',
      teamId: 'console:broken',
      error: 'tank 7 has a corrupt shape',
    });
  });

  it('a zone or digest time the store holds but nobody can read yields no digest and no crash', async () => {
    addDigestTeam(store, 'console:kv', 'Europe/Berlin', from);
    store.teams.ensure('console:odd', from);
    // Written straight to the store, past the bot's validation (a hand-edited file).
    store.db
      .prepare(
        "UPDATE teams SET time_zone = 'Mars/Olympus', digest_time = '25:99', digest_channel = 'ops' WHERE id = ?",
      )
      .run('console:odd');
    store.teams.ensure('console:odd2', from);
    store.db
      .prepare(
        "UPDATE teams SET digest_time = 'seven', digest_days = 'not json', digest_channel = 'ops' WHERE id = ?",
      )
      .run('console:odd2');
    const clock = { value: due };
    const { sch, posted } = scheduler(store, clock);
    await sch.tick(due);
    expect(posted.map((p) => p.team)).toEqual(['console:kv']);
  });

  it('a claimed digest whose stored message is unreadable is expired and logged, not posted empty', async () => {
    addDigestTeam(store, 'console:kv', 'Europe/Berlin', from);
    const clock = { value: due };
    const dying = createScheduler({
      store,
      clock: () => clock.value,
      graceMinutes: 60,
      composeDigest: headlineDigest,
      claimNotices: false,
      deliver: () => {
        throw new Error('killed');
      },
    });
    await dying.tick(due);
    store.db.prepare("UPDATE schedule_posts SET payload = '{not json' WHERE kind = 'digest'").run();
    const next = scheduler(temp.open(), clock);
    await run(next.sch, clock, due + 5 * MIN, due + 30 * MIN, 5 * MIN);
    expect(next.posted).toHaveLength(0);
    expect(next.events).toContainEqual(
      expect.objectContaining({ type: 'expired', reason: 'its stored message could not be read' }),
    );
  });
});

describe('pruning stored dedupe keys', () => {
  const DAY = 24 * HOUR;
  const keys = (s: Store, team: string) =>
    s.db
      .prepare<[string], { k: string }>(
        'SELECT dedupe_key AS k FROM processed_requests WHERE team_id = ? ORDER BY k',
      )
      .all(team)
      .map((r) => r.k);

  it('drops keys older than the kept window, per team, at most once a day', async () => {
    const t0 = utc('2026-11-20T12:00:00Z');
    for (const team of ['slack:T1', 'discord:2']) {
      store.teams.ensure(team, t0 - 30 * DAY);
      store.processedRequests.record(team, 'old', [], t0 - 8 * DAY);
      store.processedRequests.record(team, 'recent', [], t0 - 6 * DAY);
    }
    const clock = { value: t0 };
    const { sch } = scheduler(store, clock, { claimNotices: false });
    await sch.tick(t0);
    expect(keys(store, 'slack:T1')).toEqual(['recent']);
    expect(keys(store, 'discord:2')).toEqual(['recent']);

    // A key that ages past the window half a day later stays until a day has gone by since the last prune.
    store.processedRequests.record('slack:T1', 'borderline', [], t0 - 7 * DAY + HOUR);
    await sch.tick(t0 + 12 * HOUR);
    expect(keys(store, 'slack:T1')).toEqual(['borderline', 'recent']);
    await sch.tick(t0 + DAY);
    expect(keys(store, 'slack:T1')).toEqual(['recent']);
    // A redelivery of a key inside the window is still answered from the store.
    expect(store.processedRequests.find('slack:T1', 'recent')).toEqual([]);
  });

  it('a process that is not the leader prunes nothing', async () => {
    const t0 = utc('2026-11-20T12:00:00Z');
    store.teams.ensure('slack:T1', t0 - 30 * DAY);
    store.processedRequests.record('slack:T1', 'old', [], t0 - 8 * DAY);
    const clock = { value: t0 };
    const leader = scheduler(store, clock, { claimNotices: false, holder: 'a' });
    await leader.sch.tick(t0 - 10 * DAY);
    const other = scheduler(store, clock, { claimNotices: false, holder: 'b' });
    await other.sch.tick(t0 - 10 * DAY + 20_000);
    store.processedRequests.record('slack:T1', 'older', [], t0 - 20 * DAY);
    await other.sch.tick(t0 - 10 * DAY + 40_000);
    expect(keys(store, 'slack:T1')).toEqual(['old', 'older']);
  });
});
