import { toLitres } from '../../engine/units/index.js';
import type { CommandOf, Setting } from '../language/command.js';
import { unknownTankMessage } from '../language/tankName.js';
import type { Reply } from '../replies/reply.js';
import type { TankSettings } from '../store/types.js';
import { findTank, tankNamesOf } from '../tank-lookup.js';
import { type CommandContext, defineHandler, privateError } from './handler.js';
import { isValidTimeZone } from './time-zone.js';

const WEEKDAY_NAMES = ['', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
const dayList = (days: number[]) => days.map((d) => WEEKDAY_NAMES[d] ?? String(d)).join(', ');
const hourOfDay = (hour: number) => (hour === 24 ? 'midnight' : `${String(hour).padStart(2, '0')}:00`);

/** A tank setting as a patch of the stored settings (volumes in litres) and the words that confirm it. */
function tankSettingPatch(setting: Setting): { patch: TankSettings; said: string } | undefined {
  switch (setting.key) {
    case 'threshold': {
      const t = setting.threshold;
      if ('percent' in t)
        return {
          patch: { threshold: { percent: t.percent } },
          said: `threshold ${t.percent}%`,
        };
      if ('runwayDays' in t)
        return {
          patch: { threshold: { runwayDays: t.runwayDays } },
          said: `threshold ${t.runwayDays} days of use left`,
        };
      return {
        patch: { threshold: { volume: toLitres(t.volume.value, t.volume.unit) } },
        said: `threshold ${t.volume.value} ${t.volume.unit}`,
      };
    }
    case 'lead-time':
      return {
        patch: {
          leadTimeDays: setting.days,
          businessDays: setting.businessDays,
          ...(setting.cutoffHour !== undefined ? { orderCutoffHour: setting.cutoffHour } : {}),
        },
        said: `lead time ${setting.days} ${setting.businessDays ? 'business ' : ''}days${setting.cutoffHour !== undefined ? `, orders after ${setting.cutoffHour}:00 count from the next day` : ''}`,
      };
    case 'order-cutoff':
      return { patch: { orderCutoffHour: setting.hour }, said: `order cut-off ${setting.hour}:00` };
    case 'delivery-days':
      return {
        patch: { deliveryWeekdays: setting.weekdays },
        said: `delivery days ${dayList(setting.weekdays)}`,
      };
    case 'delivery-hours':
      return {
        patch: { deliveryHours: [setting.from, setting.to] },
        said: `deliveries arrive between ${hourOfDay(setting.from)} and ${hourOfDay(setting.to)}`,
      };
    case 'minimum-order':
      return {
        patch: { minimumOrder: toLitres(setting.volume.value, setting.volume.unit) },
        said: `minimum order ${setting.volume.value} ${setting.volume.unit}`,
      };
    case 'order-increment':
      return {
        patch: { orderIncrement: toLitres(setting.volume.value, setting.volume.unit) },
        said: `orders in steps of ${setting.volume.value} ${setting.volume.unit}`,
      };
    case 'safe-fill':
      return {
        patch: { safeFillPercent: setting.percent },
        said: `safe fill ${setting.percent}%`,
      };
    default:
      return undefined;
  }
}

function setTeamSetting(command: CommandOf<'set'>, { store, request }: CommandContext): Reply[] | undefined {
  const s = command.setting;
  let said: string;
  if (s.key === 'time-zone') {
    if (!isValidTimeZone(s.timeZone)) {
      return [
        privateError(
          `"${s.timeZone}" is not a time zone name I know; use an IANA name such as America/Chicago or Europe/Paris.`,
        ),
      ];
    }
    store.teams.update(request.team, { timeZone: s.timeZone });
    said = `time zone ${s.timeZone}; times without a zone are now read in it`;
  } else if (s.key === 'digest') {
    const channel = s.channel === 'here' ? request.channel : s.channel;
    store.teams.update(request.team, { digestTime: s.time, digestDays: s.weekdays, digestChannel: channel });
    said = `digest at ${s.time} on ${dayList(s.weekdays)}${s.channel === 'here' ? ' in this channel' : ` in ${channel}`}`;
  } else if (s.key === 'digest-off') {
    store.teams.update(request.team, { digestTime: null, digestChannel: null });
    said = 'digest off';
  } else {
    return undefined;
  }
  return [{ kind: 'confirmation', visibility: 'channel', headline: `Team setting saved: ${said}.` }];
}

export const setHandler = defineHandler({
  type: 'set',
  adminOnly: true,
  run: (command, context) => {
    const { store, request, now } = context;
    const team = setTeamSetting(command, context);
    if (team) {
      store.audit.record(
        request.team,
        {
          userId: request.user,
          action: 'settings.team',
          target: 'teams',
          detail: { setting: command.setting },
        },
        now,
      );
      return team;
    }
    if (!command.tank)
      return [privateError('Name the tank this setting is for, e.g. `set T4 threshold 20%`.')];
    const tank = findTank(store, request.team, command.tank);
    if (!tank)
      return [privateError(unknownTankMessage(command.tank, tankNamesOf(store.tanks.list(request.team))))];
    const s = command.setting;
    let said: string;
    if (s.key === 'product') {
      store.tanks.update(request.team, tank.id, { product: s.product }, now);
      said = `product ${s.product}`;
    } else if (s.key === 'site') {
      store.tanks.update(request.team, tank.id, { site: s.site }, now);
      said = `site ${s.site}`;
    } else {
      const change = tankSettingPatch(s);
      if (!change)
        return [privateError('That setting belongs to the team, not a tank: leave the tank name out.')];
      store.tanks.update(request.team, tank.id, { settings: { ...tank.settings, ...change.patch } }, now);
      said = change.said;
    }
    store.audit.record(
      request.team,
      {
        userId: request.user,
        action: 'settings.tank',
        target: 'tanks',
        targetId: tank.id,
        detail: { setting: s },
      },
      now,
    );
    return [{ kind: 'confirmation', visibility: 'channel', headline: `${tank.code}: ${said}.` }];
  },
});
