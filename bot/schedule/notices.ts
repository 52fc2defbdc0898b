/**
 * Notices between digests: a reading that moves a tank across a limit is said once, to the team's channel
 * (its digest channel), and a tank with no reading for `staleDays` gets one reminder a day at most.
 *
 * Each tank and rule has a stored state (notice-machine.ts). A tank is looked at again only when it has a
 * reading newer than the last one its states saw, so a tick costs two small indexed reads per tank otherwise. The
 * new state and the notice's claim are written in one transaction: a crash leaves both or neither.
 */
import { setImmediate as yieldNow } from 'node:timers/promises';
import type Database from 'better-sqlite3';
import type { Reply } from '../replies/reply.js';
import type { Store } from '../store/open-store.js';
import type { Tank, Team } from '../store/types.js';
import { tankStatus } from '../tank-status.js';
import { DEFAULT_STALE_DAYS } from './digest-sections.js';
import { checkTimeZone, formatLocalDate, instantOfLocal, localDateOf, parseWallTime } from './local-time.js';
import { type NoticeState, stepNotice } from './notice-machine.js';
import {
  bandOf,
  DEFAULT_BANDS,
  marginOf,
  NOTICE_RULES,
  type NoticeBands,
  noticeReply,
} from './notice-rules.js';
import type { PostKey } from './posts.js';
import type { ClaimNotices } from './scheduler.js';

export interface NoticeOptions extends Partial<NoticeBands> {
  /** Days without a reading before a tank counts as stale. Default 3 (DEFAULT_STALE_DAYS). */
  staleDays?: number;
}

interface StateRow {
  rule: string;
  state: NoticeState;
  seen_reading_at: number | null;
}

const DAY = 86_400_000;
/** Tank statuses computed between two yields to the event loop (each costs a few milliseconds). */
const YIELD_EVERY = 20;

function statesRepo(db: Database.Database) {
  const read = db.prepare<[string, number], StateRow>(
    'SELECT rule, state, seen_reading_at FROM notice_states WHERE team_id = ? AND tank_id = ?',
  );
  const write = db.prepare(
    `INSERT INTO notice_states (team_id, tank_id, rule, state, changed_at, seen_reading_at) VALUES (?, ?, ?, ?, ?, ?)
     ON CONFLICT (team_id, tank_id, rule) DO UPDATE SET
       changed_at = CASE WHEN state = excluded.state THEN changed_at ELSE excluded.changed_at END,
       state = excluded.state, seen_reading_at = excluded.seen_reading_at`,
  );
  return {
    read: (teamId: string, tankId: number) => read.all(teamId, tankId),
    write: (teamId: string, tankId: number, rule: string, state: NoticeState, now: number, seen: number) =>
      write.run(teamId, tankId, rule, state, now, seen),
  };
}

/** A stale reminder waits for the team's morning (its digest time, else 07:00 local) so nobody is woken. */
function morningHasCome(team: Team, now: number): { ok: boolean; localDate: string } {
  const zone = checkTimeZone(team.timeZone);
  const tz = zone.ok ? zone.value : 'UTC';
  const date = localDateOf(now, tz);
  const time = parseWallTime(team.digestTime ?? '07:00');
  const morning = instantOfLocal(date, time.ok ? time.value : { hour: 7, minute: 0 }, tz);
  return { ok: now >= morning, localDate: formatLocalDate(date) };
}

function staleReply(code: string, name: string, days: number): Reply {
  const label = name && name.toLowerCase() !== code.toLowerCase() ? `${code} ${name}` : code;
  return {
    kind: 'notice',
    visibility: 'channel',
    headline: `${label} has had no reading for ${Math.round(days)} days: its runway and orders are guesses until someone reads it (e.g. \`${code} 52in\`).`,
  };
}

interface TankContext {
  store: Store;
  repo: ReturnType<typeof statesRepo>;
  team: Team;
  channel: string;
  morning: { ok: boolean; localDate: string };
  now: number;
  claim: (key: PostKey, replies: Reply[], dueAt: number) => boolean;
  bands: NoticeBands;
  staleMs: number;
}

/**
 * Stale reminder, then the notice rules if the tank has a reading its states have not seen. Returns whether
 * it had to compute the tank's status (the costly case).
 */
function evaluateTank(tank: Tank, c: TankContext): boolean {
  const { store, team, channel, now } = c;
  const latest = store.readings.latest(team.id, tank.id, now);
  if (!latest) return false;
  if (now - latest.time >= c.staleMs && c.morning.ok) {
    const key: PostKey = {
      teamId: team.id,
      channel,
      kind: 'stale',
      key: `${tank.id}:${c.morning.localDate}`,
    };
    c.claim(key, [staleReply(tank.code, tank.name, (now - latest.time) / DAY)], now);
  }
  const known = c.repo.read(team.id, tank.id);
  const seenAll = NOTICE_RULES.every((rule) => {
    const seen = known.find((k) => k.rule === rule)?.seen_reading_at;
    return seen !== null && seen !== undefined && seen >= latest.time;
  });
  if (seenAll) return false;
  const status = tankStatus(store, team.id, tank.id, now);
  if (!status) return true;
  store.db
    .transaction(() => {
      for (const rule of NOTICE_RULES) {
        const before = known.find((k) => k.rule === rule)?.state ?? 'armed';
        const step = stepNotice(before, marginOf(rule, status), bandOf(rule, c.bands));
        c.repo.write(team.id, tank.id, rule, step.state, now, latest.time);
        if (step.transition === 'crossed') {
          const key: PostKey = {
            teamId: team.id,
            channel,
            kind: 'notice',
            key: `${tank.id}:${rule}:${latest.id}`,
          };
          c.claim(key, [noticeReply(rule, status)], now);
        }
      }
    })
    .immediate();
  return true;
}

export function noticesFromStore(options: NoticeOptions = {}): ClaimNotices {
  const bands: NoticeBands = { ...DEFAULT_BANDS, ...options };
  const staleMs = (options.staleDays ?? DEFAULT_STALE_DAYS) * DAY;
  const repos = new WeakMap<Database.Database, ReturnType<typeof statesRepo>>();

  return async (store, now, claim, report) => {
    const repo = repos.get(store.db) ?? statesRepo(store.db);
    repos.set(store.db, repo);
    for (const team of store.teams.list()) {
      const channel = team.digestChannel;
      if (!channel) continue; // no team channel set: nowhere to say it
      const context: TankContext = {
        store,
        repo,
        team,
        channel,
        morning: morningHasCome(team, now),
        now,
        claim,
        bands,
        staleMs,
      };
      let computed = 0;
      for (const tank of store.tanks.list(team.id)) {
        try {
          if (evaluateTank(tank, context)) computed++;
        } catch (error) {
          report(team.id, error);
        }
        // After a restart every tank is new to its states: let chat requests through every few tanks.
        if (computed >= YIELD_EVERY) {
          computed = 0;
          await yieldNow();
        }
      }
    }
  };
}
