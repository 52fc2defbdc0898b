import { fail, ok, type Result } from '../../engine/result.js';
import { checkTimeZone } from '../schedule/local-time.js';
import { readHourOfDay, readWeekdays } from './clockWords.js';
import type { CommandOf, ParseContext, Setting } from './command.js';
import { parsePercent, parseVolume } from './measurement.js';
import { matchTankPrefix, unknownTankMessage } from './tankName.js';

const SET_FORMS =
  'e.g. `set T4 threshold 20%`, `set T4 lead time 3 business days`, `set T4 delivery days tue,thu`, `set time zone America/Chicago` or `set digest 07:00 weekdays here`';

type SettingReader = (value: string) => Result<Setting>;

/** Setting names (longest first wins) and how each reads its value. */
const TANK_SETTINGS: [RegExp, SettingReader][] = [
  [/^(?:threshold|reorder(?:\s+point)?|alert(?:\s+at)?|warn(?:\s+at)?)$/i, readThreshold],
  [/^lead[\s-]?time$/i, readLeadTime],
  [/^(?:order\s+)?cut[\s-]?off(?:\s+hour)?$/i, (v) => mapHour(v)],
  [
    /^deliver(?:y|ies)\s+days?$/i,
    (v) => mapResult(readWeekdays(v), (weekdays) => ({ key: 'delivery-days', weekdays })),
  ],
  [
    /^min(?:imum)?\s+order$/i,
    (v) => mapResult(parseVolume(v, 'the minimum order'), (volume) => ({ key: 'minimum-order', volume })),
  ],
  [
    /^(?:order\s+)?increments?$/i,
    (v) => mapResult(parseVolume(v, 'the order increment'), (volume) => ({ key: 'order-increment', volume })),
  ],
  [
    /^(?:safe[\s-]?fill|fill\s+limit|max(?:imum)?\s+fill)$/i,
    (v) => mapResult(parsePercent(v, 'the safe fill'), (percent) => ({ key: 'safe-fill', percent })),
  ],
  [/^product$/i, (v) => ({ ok: true, value: { key: 'product', product: unquote(v) } })],
  [/^site$/i, (v) => ({ ok: true, value: { key: 'site', site: unquote(v) } })],
];
const SETTING_NAMES =
  /^(threshold|reorder point|reorder|alert at|alert|warn at|warn|lead[\s-]?time|order cut[\s-]?off hour|order cut[\s-]?off|cut[\s-]?off hour|cut[\s-]?off|delivery days|delivery day|deliveries days|minimum order|min order|order increments?|increments?|safe[\s-]?fill|fill limit|max(?:imum)? fill|product|site)\b\s*(?:to\s+|=\s*|:\s*)?(.*)$/i;

function mapResult<T>(result: Result<T>, build: (value: T) => Setting): Result<Setting> {
  return result.ok ? ok(build(result.value)) : result;
}

const unquote = (text: string): string => text.trim().replace(/^"(.*)"$|^'(.*)'$/, '$1$2');

function mapHour(text: string): Result<Setting> {
  return mapResult(readHourOfDay(text), (hour) => ({ key: 'order-cutoff', hour }));
}

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
    if (SETTING_NAMES.test(rest)) return fail(`Name the tank first: \`set T4 ${rest}\`.`);
    return fail(word ? unknownTankMessage(word, context.tankNames) : `Say what to set, ${SET_FORMS}.`);
  }
  if (known.rest === '') return fail(`Say what to set for ${known.tank}, ${SET_FORMS}.`);
  const setting = SETTING_NAMES.exec(known.rest);
  if (!setting) return fail(`I do not know the setting "${known.rest}"; ${SET_FORMS}.`);
  const [, name = '', value = ''] = setting;
  const reader = TANK_SETTINGS.find(([pattern]) => pattern.test(name.replace(/\s+/g, ' ')));
  if (!reader) return fail(`I do not know the setting "${name}"; ${SET_FORMS}.`);
  if (value.trim() === '') return fail(`Give a value for ${name}, ${SET_FORMS}.`);
  const parsed = reader[1](value.trim());
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
  const time = readClock(match[1] ?? '');
  if (!time.ok) return time;
  const daysText = (match[2] ?? '').replace(/^on\s+/i, '').trim();
  const weekdays = daysText === '' ? ok([1, 2, 3, 4, 5, 6, 7]) : readWeekdays(daysText);
  if (!weekdays.ok) return weekdays;
  const where = (match[3] ?? 'here').toLowerCase() === 'this channel' ? 'here' : (match[3] ?? 'here');
  return ok({ key: 'digest', time: time.value, weekdays: weekdays.value, channel: where });
}

/** "7", "7am", "07:00", "4:30 pm" -> "HH:MM". */
function readClock(text: string): Result<string> {
  const m = /^(\d{1,2})(?:[:.](\d{2}))?\s*([ap])?\.?m?\.?$/i.exec(text.trim());
  let hour = Number(m?.[1]);
  const minute = Number(m?.[2] ?? 0);
  const half = m?.[3]?.toLowerCase();
  if (half && (hour < 1 || hour > 12)) hour = Number.NaN;
  if (half === 'p' && hour < 12) hour += 12;
  if (half === 'a' && hour === 12) hour = 0;
  if (!m || !(hour >= 0 && hour <= 23) || minute > 59)
    return fail(`"${text}" is not a time of day; write it like 07:00 or 7am.`);
  return ok(`${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}`);
}

export { readClock };
