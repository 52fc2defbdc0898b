import { privateError } from './commands/handler.js';
import { runCommand } from './commands/index.js';
import { isValidTimeZone } from './commands/time-zone.js';
import { type AwaitingStep, type ParseContext, parseMessage } from './language/index.js';
import type { Reply } from './replies/reply.js';
import type { Request } from './request.js';
import type { Store } from './store/index.js';
import { tankNamesOf } from './tank-lookup.js';

export interface BotOptions {
  store: Store;
  /** Zone a new team starts with (the console passes --time-zone); 'UTC' otherwise. */
  defaultTimeZone?: string;
  /** Called with an unexpected error (a bug), after the sender got a friendly reply; defaults to stderr. */
  onError?: (error: unknown, request: Request) => void;
}

export interface Bot {
  handle(request: Request): Promise<Reply[]>;
}

/** Longest message the bot reads: a pasted strapping table fits, a runaway paste does not. */
const MAX_TEXT = 20_000;

const PENDING_KINDS: readonly AwaitingStep[] = ['strapping-rows', 'setup-answer', 'confirm-suspect'];
/** How long an open exchange (a question, a guided setup, a strapping table) waits for its answer. */
const PENDING_TTL_MS = 6 * 3_600_000;

/** Commands that answer or carry on the sender's open exchange (the others end it). */
const continuesExchange = (type: string): boolean =>
  ['confirm', 'strapping-rows', 'setup-answer', 'cancel', 'help', 'correct-unit', 'undo'].includes(type);

/** A request from an adapter is checked like any input: a forged or malformed one gets an error, not a crash. */
function requestProblem(request: Request): string | undefined {
  if (typeof request !== 'object' || request === null) return 'The message could not be read.';
  for (const key of ['team', 'channel', 'user'] as const) {
    const value = request[key];
    if (typeof value !== 'string' || value.length === 0 || value.length > 200) {
      return `The message came without a valid ${key}; the chat platform sent something unexpected.`;
    }
  }
  if (typeof request.text !== 'string') return 'The message had no text.';
  if (request.text.length > MAX_TEXT) {
    return `That message is ${request.text.length.toLocaleString('en-US')} characters long; send at most ${MAX_TEXT.toLocaleString('en-US')} at a time (split a long strapping table over several messages).`;
  }
  if (typeof request.receivedAt !== 'number' || !Number.isFinite(request.receivedAt)) {
    return 'The message came without a valid time.';
  }
  return undefined;
}

const validZone = (zone: string | undefined): zone is string =>
  typeof zone === 'string' && isValidTimeZone(zone);

/** The bot: one entry for every adapter. It reads no clock; `request.receivedAt` is "now". */
export function createBot(options: BotOptions): Bot {
  const { store } = options;
  const defaultTimeZone = validZone(options.defaultTimeZone) ? options.defaultTimeZone : 'UTC';
  const reportError =
    options.onError ??
    ((error: unknown) => {
      process.stderr.write(
        `tank-runway: unexpected error: ${error instanceof Error ? error.stack : String(error)}\n`,
      );
    });

  function handleNow(request: Request): Reply[] {
    const problem = requestProblem(request);
    if (problem) return [privateError(problem)];
    const now = request.receivedAt;
    const dedupeKey =
      typeof request.dedupeKey === 'string' && request.dedupeKey ? request.dedupeKey : undefined;
    if (dedupeKey) {
      const earlier = store.processedRequests.find(request.team, dedupeKey);
      if (earlier) return earlier;
    }
    return store.transaction(() => {
      const team = store.teams.ensure(request.team, now, { timeZone: defaultTimeZone });
      const member = store.teams.ensureMember(request.team, request.user, request.userName ?? null, now);
      const timeZone = validZone(request.timeZone) ? request.timeZone : team.timeZone;
      let pending = store.pending.get(request.team, request.channel, request.user);
      if (pending && now - pending.createdAt > PENDING_TTL_MS) {
        // A question left unanswered for hours is stale: a later "yes" must not confirm it by surprise.
        store.pending.clear(request.team, request.channel, request.user);
        pending = undefined;
      }
      const awaiting = PENDING_KINDS.find((k) => k === pending?.kind);
      const parseContext: ParseContext = {
        now,
        timeZone,
        tankNames: tankNamesOf(store.tanks.names(request.team)),
        ...(awaiting ? { awaiting } : {}),
      };
      const parsed = parseMessage(request.text, parseContext);
      // A different command while a question waits leaves the question behind (its reading stays aside);
      // cleared first, so a command that opens a new exchange keeps it.
      if (pending && parsed.ok && !continuesExchange(parsed.value.type)) {
        store.pending.clear(request.team, request.channel, request.user);
      }
      // parseMessage returns only zod-checked commands; a reply to anything else is a fixable error.
      const replies = parsed.ok
        ? runCommand(parsed.value, { store, team, member, request, now, timeZone })
        : [privateError(parsed.error)];
      if (dedupeKey) store.processedRequests.record(request.team, dedupeKey, replies, now);
      return replies;
    });
  }

  return {
    async handle(request) {
      try {
        return handleNow(request);
      } catch (error) {
        // The transaction rolled back: nothing from this message was stored.
        reportError(error, request);
        return [
          privateError(
            'Something went wrong on our side and nothing from that message was saved. Please send it again.',
          ),
        ];
      }
    },
  };
}
