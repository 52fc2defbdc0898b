// Shared by the scheduler's tests: a temporary store and a recording delivery sink.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Reply } from '../../bot/replies/reply.js';
import type { Deliver, DeliveryMeta } from '../../bot/schedule/scheduler.js';
import { openStore, type Store } from '../../bot/store/index.js';

export interface TempStore {
  path: string;
  open(): Store;
  cleanup(): void;
}

export function tempStore(): TempStore {
  const dir = mkdtempSync(join(tmpdir(), 'tr-schedule-'));
  const path = join(dir, 'bot.sqlite');
  const opened: Store[] = [];
  return {
    path,
    open: () => {
      const store = openStore(path);
      opened.push(store);
      return store;
    },
    cleanup: () => {
      for (const store of opened) store.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

export interface Posted {
  team: string;
  channel: string;
  replies: Reply[];
  meta: DeliveryMeta;
  at: number;
}

/** A sink that records what was posted, at the injected time of the tick that posted it. */
export function recordingSink(now: () => number): { posted: Posted[]; deliver: Deliver } {
  const posted: Posted[] = [];
  return {
    posted,
    deliver: (team, channel, replies, meta) => {
      posted.push({ team, channel, replies, meta, at: now() });
    },
  };
}

/** Adds a team with a digest at `time` local in `zone` to `channel`, every day unless `weekdays` is given. */
export function addDigestTeam(
  store: Store,
  id: string,
  zone: string,
  createdAt: number,
  time = '07:00',
  weekdays: number[] = [],
  channel = 'ops',
): void {
  store.teams.ensure(id, createdAt, { timeZone: zone });
  store.teams.update(id, { digestTime: time, digestDays: weekdays, digestChannel: channel });
}
