// A bot on a fresh temporary store for each test, and a `say` that sends one message a moment after the last.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach } from 'vitest';
import { type Bot, createBot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { type TankStatus, tankStatus } from '../../bot/tank-status.js';

export interface BotSessionOptions {
  team: string;
  /** The clock at the start of each test, ISO 8601. */
  start: string;
  channel?: string;
  /** How far the clock moves before each message, ms. */
  stepMs?: number;
}

export interface BotSession {
  readonly store: Store;
  readonly bot: Bot;
  /** The clock the next message is stamped from; a test may move it. */
  clock: number;
  say(text: string, user?: string): Promise<Reply[]>;
  statusOf(code: string): TankStatus;
}

/** Registers beforeEach/afterEach hooks in the calling test file; read the fields inside tests only. */
export function useBotSession(options: BotSessionOptions): BotSession {
  const { team, channel = 'c1', stepMs = 1000 } = options;
  let dir = '';
  let store: Store | undefined;
  let bot: Bot | undefined;
  const live = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('the bot session is only open inside a test');
    return value;
  };
  const session: BotSession = {
    get store() {
      return live(store);
    },
    get bot() {
      return live(bot);
    },
    clock: 0,
    say(text, user = 'ann') {
      session.clock += stepMs;
      return live(bot).handle({ team, channel, user, text, receivedAt: session.clock });
    },
    statusOf(code) {
      const s = live(store);
      const status = tankStatus(s, team, s.tanks.byCode(team, code)!.id, session.clock);
      if (!status) throw new Error(`no status for ${code}`);
      return status;
    },
  };
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'tr-bot-session-'));
    store = openStore(join(dir, 'bot.sqlite'));
    bot = createBot({ store });
    session.clock = Date.parse(options.start);
  });
  afterEach(() => {
    store?.close();
    store = undefined;
    bot = undefined;
    rmSync(dir, { recursive: true, force: true });
  });
  return session;
}

/** The value of a reply's fact, by its label. */
export const factOf = (reply: Reply | undefined, label: string): string | undefined =>
  reply?.facts?.find((f) => f.label === label)?.value;
