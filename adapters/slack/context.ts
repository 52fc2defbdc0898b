import type { Logger } from '@slack/bolt';
import type { Bot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import type { Outbox } from './outbox.js';
import type { TeamClients } from './team-clients.js';
import type { UserZones } from './user-zones.js';

/** What every listener needs; built once by createSlackAdapter. */
export interface SlackContext {
  bot: Bot;
  clients: TeamClients;
  zones: UserZones;
  outbox: Outbox;
  logger: Logger;
  clock: () => number;
  /** The home tab's board for a team (`slack:T123`), when the composition root provides one. */
  home?: (team: string, now: number) => Reply[] | Promise<Reply[]>;
}
