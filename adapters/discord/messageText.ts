/**
 * Subcommand options and the setup form -> one message in the bot's language. Only translation: the bot's
 * parser judges the result, so a bad value gets the same friendly error it gets in the console.
 */
import { fail, ok, type Result } from '../../engine/result.js';
import { HELP_TOPICS, LOW_WINDOWS, SUBCOMMANDS, type Subcommand } from './commandDefinition.js';

/** String options of one subcommand, by name; absent options are missing keys. */
export type Options = Readonly<Record<string, string | undefined>>;

/** Newlines and runs of spaces in a one-line option would split the message the parser reads. */
const clean = (text: string | undefined) => (text ?? '').replace(/\s+/g, ' ').trim();

/** "7:30" reads as a time of day only after "at"; words like "yesterday 4pm" stand alone. */
function whenWords(when: string): string {
  if (!when) return '';
  return /^\d/.test(when) ? ` at ${when}` : ` ${when}`;
}

export function isSubcommand(name: string): name is Subcommand {
  return (SUBCOMMANDS as readonly string[]).includes(name);
}

/**
 * The message a subcommand stands for. `setup` has none (it opens a form) and is handled by the adapter.
 */
export function messageFor(subcommand: string, options: Options): Result<string> {
  if (!isSubcommand(subcommand) || subcommand === 'setup') {
    return fail(`There is no "${subcommand}" here; try the help subcommand.`);
  }
  const tank = clean(options.tank);
  const need = (value: string, what: string): Result<string> =>
    value ? ok(value) : fail(`Give the ${what}.`);
  switch (subcommand) {
    case 'log': {
      const reading = need(clean(options.reading), 'reading, e.g. 52.3in or 48%');
      if (!reading.ok) return reading;
      if (!tank) return fail('Give the tank.');
      return ok(`${tank} ${reading.value}${whenWords(clean(options.when))}`);
    }
    case 'delivery': {
      const amount = need(clean(options.amount), 'delivered amount, e.g. 400 gal');
      if (!amount.ok) return amount;
      if (!tank) return fail('Give the tank.');
      const ticket = clean(options.ticket);
      const level = clean(options.level_after);
      return ok(
        `delivered ${amount.value} to ${tank}${ticket ? ` ticket ${ticket}` : ''}${whenWords(clean(options.when))}${level ? ` level ${level}` : ''}`,
      );
    }
    case 'ask':
      return tank ? ok(`${tank}?`) : ok('all');
    case 'list': {
      const window = clean(options.running_low);
      if (!window) return ok('all');
      if (!LOW_WINDOWS.includes(window)) return fail(`Choose one of: ${LOW_WINDOWS.join(', ')}.`);
      return ok(`which tanks run low ${window}?`);
    }
    case 'settings': {
      const setting = need(clean(options.setting), 'setting, e.g. threshold 20%');
      if (!setting.ok) return setting;
      const body = setting.value.replace(/^set\s+/i, '');
      return ok(tank ? `set ${tank} ${body}` : `set ${body}`);
    }
    case 'timezone': {
      const zone = need(clean(options.zone), 'time zone, e.g. America/Chicago');
      return zone.ok ? ok(`set time zone ${zone.value}`) : zone;
    }
    case 'help': {
      const topic = clean(options.topic);
      return ok(topic && HELP_TOPICS.includes(topic) ? `help ${topic}` : 'help');
    }
    case 'say': {
      // Kept as typed (newlines too): a pasted strapping table is several lines of one message.
      const text = (options.message ?? '').trim();
      return text ? ok(text) : fail('Write a message, e.g. "T4 52.3in" or "help".');
    }
  }
}

/** The fields of the tank setup form. */
export interface SetupForm {
  code: string;
  /** Shape and sizes, e.g. "vertical-cylinder diameter=48in length=72in"; or "strapping" then CSV lines. */
  shape: string;
  unit: string;
  product?: string;
  site?: string;
}

/** A value inside key="..." must not close the quotes early. */
const quoted = (value: string) => `"${value.replaceAll('"', "'")}"`;

/**
 * The form becomes one `add tank ...` message; lines after the first line of the shape field are a strapping
 * table and follow on their own lines, as in the console.
 */
export function setupMessage(form: SetupForm): Result<string> {
  const code = clean(form.code);
  const [shapeLine = '', ...tableLines] = (form.shape ?? '').split(/\r?\n/);
  const shape = clean(shapeLine);
  const unit = clean(form.unit);
  if (!code) return fail('Give the tank a short code, e.g. T4.');
  if (!shape) return fail('Give the shape and sizes, e.g. vertical-cylinder diameter=48in length=72in.');
  if (!unit) return fail('Give the volume unit, e.g. gal or L.');
  const product = clean(form.product);
  const site = clean(form.site);
  const first = [
    `add tank ${code} ${shape} unit=${unit}`,
    product ? ` product=${quoted(product)}` : '',
    site ? ` site=${quoted(site)}` : '',
  ].join('');
  const table = tableLines.map((l) => l.trim()).filter((l) => l !== '');
  return ok([first, ...table].join('\n'));
}
