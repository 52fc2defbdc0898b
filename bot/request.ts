/** One message from a person, as every adapter hands it to the bot. */
export interface Request {
  /** Platform-qualified team id, e.g. "console:demo", "slack:T024BE7LD", "discord:81384788765712384". */
  team: string;
  /** Platform channel id (the console uses "console"). Digests and notices go to channels. */
  channel: string;
  /** Platform user id; the first user the store sees for a team becomes its admin. */
  user: string;
  /** Display name, when the platform gives one. */
  userName?: string;
  /** The message text in the bot's language (slash-command text, a mention without the mention, a console line). */
  text: string;
  /** When the platform received it, epoch ms (UTC). Times in words are resolved against this instant. */
  receivedAt: number;
  /** The sender's IANA zone when the platform knows it (Slack users.info); else the team's zone is used. */
  timeZone?: string;
  /** A platform key that is the same on a redelivery (Slack event_id, Discord interaction id): dedupe on it. */
  dedupeKey?: string;
}
