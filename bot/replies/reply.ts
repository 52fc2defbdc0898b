/**
 * The platform-neutral reply model. Adapters render it (Block Kit, embeds, plain text); the bot never
 * formats for a platform.
 */
export type ReplyKind = 'confirmation' | 'answer' | 'question' | 'error' | 'help' | 'digest' | 'notice';

/** Who should see a reply: the whole channel (readings, deliveries, digests) or only the sender (errors, help). */
export type Visibility = 'channel' | 'sender';

export interface Fact {
  label: string;
  value: string;
}

export interface Table {
  columns: string[];
  rows: string[][];
}

/** A follow-up the person can take with one tap; `command` is a message in the bot's language. */
export interface Action {
  label: string;
  command: string;
  style?: 'primary' | 'danger';
}

/** Data for the level-history chart; bot/replies renders it to PNG for platforms that take images. */
export interface LevelChart {
  title: string;
  volumeUnit: string;
  /** Volumes in the tank's display unit; times epoch ms. */
  history: { time: number; volume: number }[];
  forecast: { time: number; volume: number; low: number; high: number }[];
  deliveries: { time: number; volume: number }[];
  /** Refills (pick-ups on a filling tank) the readings show but nobody logged: start time, estimated volume. */
  detected?: { time: number; volume: number }[];
  /** A filling tank (waste): its refills are pick-ups taken away and its threshold is the pick-up level. */
  filling?: boolean;
  threshold?: number;
  capacity?: number;
  timeZone: string;
}

export interface Reply {
  kind: ReplyKind;
  visibility: Visibility;
  /** One line a person reads first; it carries the main number. */
  headline: string;
  facts?: Fact[];
  table?: Table;
  chart?: LevelChart;
  actions?: Action[];
  /** Safety wording for fuels, LPG, chemicals and overfill; brief, deferring to local codes. */
  caution?: string;
}
