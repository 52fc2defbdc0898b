import { fail, ok, type Result } from '../../engine/result.js';
import { checkTimeZone } from '../schedule/local-time.js';
import { formatClock, readClockTime, readHourOfDay, readHourRange, readWeekdays } from './clockWords.js';
import type { CommandOf, ParseContext, Setting } from './command.js';
import { parsePercent, parseVolume } from './measurement.js';
import { matchTankPrefix, unknownTankMessage } from './tankName.js';

const SET_FORMS =
  'e.g. `set T4 threshold 20%`, `set T4 lead time 3 business days`, `set T4 delivery days tue,thu`, `set T4 delivery hours 8-12`, `set time zone America/Chicago` or `set digest 07:00 weekdays here`';

type SettingReader = (value: string) => Result<Setting>;

/** Each tank setting: the words that name it and how it reads its value. */
const TANK_SETTINGS: [RegExp, SettingReader][] = [
  [/threshold|reorder(?:\s+point)?|alert(?:\s+at)?|warn(?:\s+at)?/, readThreshold],
  [/lead[\s-]?time/, readLeadTime],
  [
    /(?:order\s+)?cut[\s-]?off(?:\s+hour)?/,
    (v) => mapResult(readHourOfDay(v), (hour) => ({ key: 'order-cutoff', hour })),
  ],
  [
    /deliver(?:y|ies)\s+(?:hours|window|times?)/,
    (v) => mapResult(readHourRange(v), ([from, to]) => ({ key: 'delivery-hours', from, to })),
  ],
  [
    /deliver(?:y|ies)\s+days?/,
    (v) => mapResult(readWeekdays(v), (weekdays) => ({ key: 'delivery-days', weekdays })),
  ],
  [
    /min(?:imum)?\s+order/,
    (v) => mapResult(parseVolume(v, 'the minimum order'), (volume) => ({ key: 'minimum-order', volume })),
  ],
  [
    /(?:order\s+)?increments?/,
    (v) => mapResult(parseVolume(v, 'the order increment'), (volume) => ({ key: 'order-increment', volume })),
  ],
  [
    /safe[\s-]?fill|fill\s+limit|max(?:imum)?\s+fill/,
    (v) => mapResult(parsePercent(v, 'the safe fill'), (percent) => ({ key: 'safe-fill', percent })),
  ],
  [/product/, (v) => ok({ key: 'product', product: unquote(v) })],
  [/site/, (v) => ok({ key: 'site', site: unquote(v) })],
];

/** The setting named at the start of `text`, and the words of its value. */
function findSetting(text: string): { read: SettingReader; name: string; value: string } | undefined {
  for (const [names, read] of TANK_SETTINGS) {
    const m = new RegExp(`^(${names.source})\\b\\s*(?:to\\s+|=\\s*|:\\s*)?(.*)$`, 'i').exec(text);
    if (m) return { read, name: m[1] ?? '', value: (m[2] ?? '').trim() };
  }
  return undefined;
}

function mapResult<T>(result: Result<T>, build: (value: T) => Setting): Result<Setting> {
  return result.ok ? ok(build(result.value)) : result;
}

const unquote = (text: string): string => text.trim().replace(/^"(.*)"$|^'(.*)'$/, '$1$2');

/** `20%`, `150 gal`, `5 days`. */
function readThreshold(text: string): Result<Setting> {
  const days = /^(\d+(?:\.\d+)?)\s*(?:days?|d)(?:\s+of\s+(?:runway|supply|stock))?$/i.exec(text.trim());
  if (days) return ok({ key: 'threshold', threshold: { runwayDays: Number(days[1]) } });
  if (/%|percent|pct/i.test(text))
    return mapResult(parsePercent(text, 'the threshold'), (percent) => ({
      key: 'threshold',
      threshold: { percent },
    }));
  const volume = parseVolume(text, 'the threshold');
  if (!volume.ok)
    return fail(`Give the threshold as a percent, a volume or days of runway, e.g. 20%, 150 gal or 5 days.`);
  return ok({ key: 'threshold', threshold: { volume: volume.value } });
}

/** `3 days`, `3 business days`, `2 working days cutoff 14:00`. */
function readLeadTime(text: string): Result<Setting> {
  const match =
    /^(\d+(?:\.\d+)?)\s*(business|working|work|calendar)?\s*(?:days?|d)\b\s*(?:,?\s*(?:with\s+)?(?:order\s+)?cut[\s-]?off(?:\s+(?:at|hour))?\s+(.+))?$/i.exec(
      text.trim(),
    );
  if (!match) return fail('Give the lead time in days, e.g. `3 days` or `3 business days cutoff 14:00`.');
  const days = Number(match[1]);
  const businessDays = /business|working|work/i.test(match[2] ?? '');
  if (match[3] === undefined) return ok({ key: 'lead-time', days, businessDays });
  const hour = readHourOfDay(match[3]);
  if (!hour.ok) return hour;
  return ok({ key: 'lead-time', days, businessDays, cutoffHour: hour.value });
}

/** `set time zone America/Chicago`, `set digest 07:00 weekdays here`, `set T4 threshold 20%`. */
export function parseSet(text: string, context: ParseContext): Result<CommandOf<'set'>> {
  const rest = text.replace(/^set\b\s*/i, '').trim();
  const zone = /^(?:team\s+)?(?:time\s*zone|tz|zone)\s*(?:to\s+|=\s*)?(.*)$/i.exec(rest);
  if (zone) {
    const name = (zone[1] ?? '').trim();
    const checked = checkTimeZone(name);
    if (!name || !checked.ok)
      return fail(checked.ok ? 'Give the zone, e.g. `set time zone America/Chicago`.' : checked.error);
    return ok({ type: 'set', setting: { key: 'time-zone', timeZone: name }, raw: text });
  }
  const digest = /^(?:daily\s+)?digest\b\s*(.*)$/i.exec(rest);
  if (digest) {
    const setting = readDigest(digest[1] ?? '');
    return setting.ok ? ok({ type: 'set', setting: setting.value, raw: text }) : setting;
  }
  const known = matchTankPrefix(rest, context.tankNames);
  if (!known) {
    const word = rest.split(/\s+/)[0] ?? '';
    if (findSetting(rest)) return fail(`Name the tank first: \`set T4 ${rest}\`.`);
    return fail(word ? unknownTankMessage(word, context.tankNames) : `Say what to set, ${SET_FORMS}.`);
  }
  if (known.rest === '') return fail(`Say what to set for ${known.tank}, ${SET_FORMS}.`);
  const setting = findSetting(known.rest);
  if (!setting) return fail(`I do not know the setting "${known.rest}"; ${SET_FORMS}.`);
  if (setting.value === '') return fail(`Give a value for ${setting.name}, ${SET_FORMS}.`);
  const parsed = setting.read(setting.value);
  if (!parsed.ok) return parsed;
  return ok({ type: 'set', tank: known.tank, setting: parsed.value, raw: text });
}

/** `07:00 weekdays here`, `7am daily #ops`, `off`. Days default to every day, the channel to here. */
function readDigest(text: string): Result<Setting> {
  const t = text.trim().replace(/^(?:at|to)\s+/i, '');
  if (/^(?:off|none|stop|disabled?)$/i.test(t)) return ok({ key: 'digest-off' });
  const match =
    /^(\d{1,2}(?:[:.]\d{2})?\s*(?:[ap]\.?m\.?)?)\s*(.*?)\s*(?:(?:in|to|on)\s+)?(here|this channel|#[\w-]+|<#\w+(?:\|[\w-]*)?>)?$/i.exec(
      t,
    );
  if (!match)
    return fail(
      'Write the digest like `set digest 07:00 weekdays here` (a time, optional days, optional channel).',
    );
  const time = readClockTime(match[1] ?? '');
  if (!time.ok) return time;
  const daysText = (match[2] ?? '').replace(/^on\s+/i, '').trim();
  const weekdays = daysText === '' ? ok([1, 2, 3, 4, 5, 6, 7]) : readWeekdays(daysText);
  if (!weekdays.ok) return weekdays;
  const where = (match[3] ?? 'here').toLowerCase() === 'this channel' ? 'here' : (match[3] ?? 'here');
  return ok({ key: 'digest', time: formatClock(time.value), weekdays: weekdays.value, channel: where });
}
