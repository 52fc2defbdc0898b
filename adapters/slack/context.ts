import type { Logger } from '@slack/bolt';
import type { Bot } from '../../bot/bot.js';
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
}
