/**
 * The scheduler: morning digests and notices, each posted exactly once per channel, in the team's zone.
 *
 * It has no clock and no timer of its own: `tick(now)` does all the work, and a thin loop outside (see
 * `startLoop`) calls it every so often. One tick:
 *   1. takes or renews the lease (another live process holding it means: do nothing);
 *   2. claims every digest that is due and not yet claimed, with its replies, in one transaction that also
 *      checks the lease; a digest missed by more than the grace period is recorded as skipped and logged;
 *   3. claims notices for threshold crossings and stale tanks (notices.ts);
 *   4. delivers the pending claims, marking each delivered after `deliver` returns. A claim left pending by a
 *      crash is retried (same replies, same key) while still within the grace period, else expired and logged.
 */
import { randomUUID } from 'node:crypto';
import { setImmediate as yieldNow } from 'node:timers/promises';
import type { Reply } from '../replies/reply.js';
import type { Store } from '../store/open-store.js';
import type { Team } from '../store/types.js';
import { digestFromStore } from './digest.js';
import { createDigestCalendar, type DigestOccurrence } from './digest-calendar.js';
import { createLease, LeaseLostError } from './lease.js';
import { noticesFromStore } from './notices.js';
import { type PostKey, type PostKind, postsRepo } from './posts.js';

export interface DeliveryMeta {
  kind: PostKind;
  /** Stable across retries of the same post: adapters that can deduplicate (a Discord nonce) use it. */
  key: string;
}

/** Posts replies to a team's channel; throws (or rejects) when the platform did not take the message. */
export type Deliver = (
  team: string,
  channel: string,
  replies: Reply[],
  meta: DeliveryMeta,
) => Promise<void> | void;

/** Builds a digest for a team at `now`; `since` is when the previous digest to that channel was due. */
export type ComposeDigest = (store: Store, team: Team, now: number, since: number | null) => Reply;

/** Claims notices due at `now` (see notices.ts); gets the claim function so each claim checks the lease. */
export type ClaimNotices = (
  store: Store,
  now: number,
  claim: (key: PostKey, replies: Reply[], dueAt: number) => boolean,
  /** A tank or team that could not be evaluated (the others go on). */
  report: (teamId: string, error: unknown) => void,
) => void | Promise<void>;

export type ScheduleEvent =
  | { type: 'claimed' | 'delivered'; post: PostKey }
  | { type: 'skipped' | 'expired'; post: PostKey; dueAt: number; reason: string }
  | { type: 'delivery-failed'; post: PostKey; error: string }
  | { type: 'not-leader'; holder: string }
  | { type: 'compose-failed'; teamId: string; error: string }
  | { type: 'tick-failed'; error: string };

export interface SchedulerOptions {
  store: Store;
  deliver: Deliver;
  clock: () => number;
  /** A post due longer ago than this is not sent any more (logged instead). */
  graceMinutes: number;
  /** Default: `digestFromStore` (digest.ts). */
  composeDigest?: ComposeDigest;
  /** Default: `noticesFromStore()` (notices.ts); pass `false` for digests only. */
  claimNotices?: ClaimNotices | false;
  /** How long the lease lasts without renewal; ticks must come more often than this. Default 2 minutes. */
  leaseTtlMs?: number;
  /** This process's name in the lease; default a random id. */
  holder?: string;
  log?: (event: ScheduleEvent) => void;
}

export interface TickReport {
  leader: boolean;
  delivered: PostKey[];
}

export interface Scheduler {
  readonly holder: string;
  tick(now?: number): Promise<TickReport>;
  /** Gives up the lease (clean shutdown). */
  release(): void;
}

const DAY = 86_400_000;
/**
 * Dedupe keys are kept this long. Platforms redeliver an event within minutes to hours (common practice, from
 * memory: Slack retries within about an hour, Discord replays a resumed session's events), so a week is ample.
 */
export const DEDUPE_KEEP_MS = 7 * DAY;

export function createScheduler(options: SchedulerOptions): Scheduler {
  const { store, deliver, clock } = options;
  const composeDigest = options.composeDigest ?? digestFromStore;
  const claimNotices = options.claimNotices === undefined ? noticesFromStore() : options.claimNotices;
  // A grace period that is not a number (a bad setting) falls back to an hour rather than to never/always.
  const graceMs = (Number.isFinite(options.graceMinutes) ? Math.max(0, options.graceMinutes) : 60) * 60_000;
  const leaseTtlMs = options.leaseTtlMs ?? 120_000;
  const holder = options.holder ?? randomUUID();
  const log = options.log ?? (() => {});
  const lease = createLease(store.db, 'scheduler', holder, leaseTtlMs);
  const posts = postsRepo(store.db);
  const calendar = createDigestCalendar();
  /** When this process last pruned dedupe keys; at most once a day, and only as the leader. */
  let prunedAt = Number.NEGATIVE_INFINITY;

  /** Claims a post in one IMMEDIATE transaction that first re-checks the lease. */
  const claimIfLeader = store.db.transaction((key: PostKey, dueAt: number, replies: Reply[], now: number) => {
    // Losing the lease mid-tick aborts the caller's transaction too (a notice's state change rolls back).
    if (!lease.holds(now)) throw new LeaseLostError(holder);
    return posts.claim(key, dueAt, replies, holder, now);
  });
  const claim = (key: PostKey, replies: Reply[], dueAt: number, now: number): boolean => {
    // A daily reminder is offered on every tick of its day: a plain read spares the write lock after the first.
    if (posts.exists(key)) return false;
    const claimed = claimIfLeader.immediate(key, dueAt, replies, now);
    if (claimed) log({ type: 'claimed', post: key });
    return claimed;
  };

  function claimDigest(team: Team, occurrence: DigestOccurrence, now: number): void {
    const key: PostKey = {
      teamId: team.id,
      channel: occurrence.channel,
      kind: 'digest',
      key: occurrence.localDate,
    };
    if (posts.exists(key)) return;
    if (now - occurrence.dueAt > graceMs) {
      const reason = `missed by more than the ${options.graceMinutes}-minute grace period`;
      if (posts.skip(key, occurrence.dueAt, reason, now)) {
        log({ type: 'skipped', post: key, dueAt: occurrence.dueAt, reason });
      }
      return;
    }
    const since = posts.lastDigestDueAt(team.id, occurrence.channel);
    claim(key, [composeDigest(store, team, now, since)], occurrence.dueAt, now);
  }

  async function deliverPending(now: number): Promise<PostKey[]> {
    const delivered: PostKey[] = [];
    for (const post of posts.take(holder, now, leaseTtlMs)) {
      const key: PostKey = { teamId: post.teamId, channel: post.channel, kind: post.kind, key: post.key };
      const late = now - post.dueAt > graceMs;
      if (late || post.replies.length === 0) {
        const reason = late
          ? `still undelivered after the ${options.graceMinutes}-minute grace period`
          : 'its stored message could not be read';
        if (posts.expire(key, reason)) log({ type: 'expired', post: key, dueAt: post.dueAt, reason });
        continue;
      }
      try {
        await deliver(post.teamId, post.channel, post.replies, { kind: post.kind, key: deliveryKey(key) });
      } catch (error) {
        log({
          type: 'delivery-failed',
          post: key,
          error: error instanceof Error ? error.message : String(error),
        });
        continue;
      }
      posts.markDelivered(key, now);
      delivered.push(key);
      log({ type: 'delivered', post: key });
    }
    return delivered;
  }

  async function runTick(now: number): Promise<TickReport> {
    if (!lease.acquire(now)) {
      log({ type: 'not-leader', holder });
      return { leader: false, delivered: [] };
    }
    // One team's failure (a bug, a broken tank) must not hold up the other teams' digests: log and go on;
    // its digest is tried again on the next tick while the grace period lasts.
    const report = (teamId: string, error: unknown) => {
      if (error instanceof LeaseLostError) throw error;
      log({ type: 'compose-failed', teamId, error: error instanceof Error ? error.message : String(error) });
    };
    const pruneNow = now - prunedAt >= DAY;
    if (pruneNow) prunedAt = now;
    try {
      for (const team of store.teams.list()) {
        if (pruneNow) store.processedRequests.prune(team.id, now - DEDUPE_KEEP_MS);
        const due = calendar.due(team, now, graceMs + DAY);
        try {
          for (const occurrence of due) claimDigest(team, occurrence, now);
        } catch (error) {
          report(team.id, error);
        }
        // Composing a digest is the heavy part: let the process answer chat requests in between.
        if (due.length > 0) await yieldNow();
      }
      if (claimNotices) {
        await claimNotices(store, now, (key, replies, dueAt) => claim(key, replies, dueAt, now), report);
      }
    } catch (error) {
      if (!(error instanceof LeaseLostError)) throw error;
      log({ type: 'not-leader', holder });
      return { leader: false, delivered: [] };
    }
    return { leader: true, delivered: await deliverPending(now) };
  }

  // Ticks never overlap: a tick that arrives while one runs waits for it, then runs with its own time.
  let running: Promise<unknown> = Promise.resolve();
  return {
    holder,
    tick: (now = clock()) => {
      const next = running.then(() => runTick(now));
      running = next.catch(() => {});
      return next;
    },
    release: () => lease.release(),
  };
}

/** The key a platform may deduplicate on: the same for every retry of one post. */
export function deliveryKey(key: PostKey): string {
  return `${key.teamId}|${key.channel}|${key.kind}|${key.key}`;
}

/**
 * Calls `tick` every `intervalMs` (unref'd: it never keeps a process alive on its own) and reports a failed
 * tick through `log` rather than crashing. Returns a stop function.
 */
export function startLoop(
  scheduler: Scheduler,
  intervalMs: number,
  log?: (event: ScheduleEvent) => void,
): () => void {
  const timer = setInterval(() => {
    scheduler.tick().catch((error: unknown) => {
      log?.({ type: 'tick-failed', error: error instanceof Error ? error.message : String(error) });
    });
  }, intervalMs);
  timer.unref();
  return () => clearInterval(timer);
}
