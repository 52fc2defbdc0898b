import type { CommandOf, CommandType } from '../language/command.js';
import type { Reply } from '../replies/reply.js';
import type { Request } from '../request.js';
import type { Store } from '../store/index.js';
import type { Member, Team } from '../store/types.js';

/** What a handler knows about the message it answers. */
export interface CommandContext {
  store: Store;
  team: Team;
  member: Member;
  request: Request;
  /** The instant the message arrived (Request.receivedAt): handlers read no clock. */
  now: number;
  /** The sender's zone when the platform gives one, else the team's. */
  timeZone: string;
}

/**
 * One command of the language. `run` is synchronous on purpose: the bot calls it inside one SQLite
 * transaction, so whatever it writes is committed together or not at all (a throw rolls it back).
 */
export interface CommandHandler<T extends CommandType = CommandType> {
  type: T;
  /** Admin-only commands change tanks and team settings; members log readings and ask. */
  adminOnly?: boolean;
  run(command: CommandOf<T>, context: CommandContext): Reply[];
}

/** Helper so each file states its command type once and gets the narrowed command. */
export const defineHandler = <T extends CommandType>(handler: CommandHandler<T>): CommandHandler<T> =>
  handler;

/** A reply only the sender sees: errors a person can fix, help. */
export const privateError = (headline: string, facts?: Reply['facts']): Reply => ({
  kind: 'error',
  visibility: 'sender',
  headline,
  ...(facts ? { facts } : {}),
});
