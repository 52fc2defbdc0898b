/**
 * The command words of the bot's language, in one place: plain English of our own choosing. Parsers read
 * these tables so a new synonym is one edit here.
 */

/** An example of each command word, shown when a message starts with one but does not parse. */
export const COMMAND_EXAMPLES: Readonly<Record<string, string>> = {
  help: 'help readings',
  undo: 'undo',
  add: 'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
  new: 'new tank',
  remove: 'remove tank T4',
  rename: 'rename tank T4 to GEN-1',
  set: 'set T4 threshold 20%',
  delete: 'delete the 7:30 reading',
  delivered: 'delivered 150 gal to T4',
  delivery: 'delivery 150 gal to T4',
  digest: 'digest now',
  all: 'all',
  status: 'status T4',
  tanks: 'tanks',
  which: 'which tanks run low this week?',
  what: 'what runs low this week?',
  how: 'how long does T4 last?',
  yes: 'yes',
  no: 'no',
  cancel: 'cancel',
  done: 'done',
};

/** First words that start a command (lower case): to suggest the nearest on a typo. */
export const COMMAND_WORDS = Object.keys(COMMAND_EXAMPLES);

export const YES_WORDS = new Set(['yes', 'y', 'yep', 'yeah', 'ok', 'okay', 'correct', 'confirm', 'keep it']);
export const NO_WORDS = new Set(['no', 'n', 'nope', 'wrong', 'discard', 'drop it']);
export const CANCEL_WORDS = new Set(['cancel', 'stop', 'abort', 'never mind', 'nevermind']);
export const DONE_WORDS = new Set(['done', 'end', 'finished', 'that is all', "that's all"]);
export const UNDO_WORDS = new Set(['undo', 'undo that', 'undo last', 'scratch that']);
export const OVERVIEW_WORDS = new Set(['all', 'status', 'tanks', 'all tanks', 'overview', 'summary']);
export const DIGEST_NOW_WORDS = new Set(['digest now', 'send digest', 'send the digest', 'digest']);

/** Words that start a delivery ("delivered 150 gal to T4", "T4 delivered 150 gal"). */
export const DELIVERY_VERBS = ['delivered', 'delivery of', 'delivery', 'received', 'got', 'filled'];

/** Words that, after a tank name, mark the number as the empty space above the liquid. "Outage" is a trade
 * synonym of ullage (common practice). */
export const ULLAGE_WORDS = new Set(['ullage', 'outage', 'space', 'headspace']);

/** Day names -> ISO weekday (1 = Monday). */
export const WEEKDAYS: Readonly<Record<string, number>> = {
  mon: 1,
  monday: 1,
  tue: 2,
  tues: 2,
  tuesday: 2,
  wed: 3,
  weds: 3,
  wednesday: 3,
  thu: 4,
  thur: 4,
  thurs: 4,
  thursday: 4,
  fri: 5,
  friday: 5,
  sat: 6,
  saturday: 6,
  sun: 7,
  sunday: 7,
};

/** Day-set words for digests and delivery days. */
export const DAY_SETS: Readonly<Record<string, number[]>> = {
  daily: [1, 2, 3, 4, 5, 6, 7],
  'every day': [1, 2, 3, 4, 5, 6, 7],
  everyday: [1, 2, 3, 4, 5, 6, 7],
  weekdays: [1, 2, 3, 4, 5],
  'business days': [1, 2, 3, 4, 5],
  weekends: [6, 7],
};
