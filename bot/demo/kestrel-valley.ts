import type { TankSettings } from '../store/types.js';

/**
 * DEMO DATA, invented: the "Kestrel Valley Water Co-op", a small water utility of our own making. Every
 * name, site, product figure and reading here is made up for the demo and the tests.
 */
export const DEMO_TEAM_NAME = 'Kestrel Valley Water Co-op (DEMO DATA)';
export const DEMO_TIME_ZONE = 'America/Denver';
export const DEMO_USERS = ['dana.ops', 'luis.field', 'mae.night'] as const;

/** How a demo tank is used: litres per day on weekdays and weekends, and how deliveries or pick-ups go. */
export interface DemoTank {
  code: string;
  name: string;
  site: string;
  product: string;
  spec: unknown;
  settings: TankSettings;
  /** How people read it: a level in this unit with this resolution, or a percent gauge. */
  gauge: { kind: 'level'; unit: 'in' | 'cm'; step: number } | { kind: 'percent'; step: number };
  /** Litres per day: emptying tanks consume, filling tanks fill. */
  usePerDay: { weekday: number; weekend: number };
  /** A reading every this many days, at about this local hour. */
  readEveryDays: number;
  readHour: number;
  /** Refill (or pump-out) when the volume passes this fraction of capacity, by this fraction; a few go unlogged. */
  refillAt: number;
  refillTo: number;
  /** Gauge noise, in the gauge's unit (one standard deviation). */
  noise: number;
}

export const DEMO_TANKS: DemoTank[] = [
  {
    code: 'HYPO-1',
    name: 'Hypochlorite day tank',
    site: 'Mill Creek Lift Station',
    product: 'sodium hypochlorite 12.5%',
    spec: { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 },
    settings: {
      threshold: { percent: 25 },
      leadTimeDays: 3,
      businessDays: true,
      deliveryWeekdays: [2, 4],
      safeFillPercent: 90,
    },
    gauge: { kind: 'level', unit: 'in', step: 0.1 },
    usePerDay: { weekday: 26, weekend: 20 },
    readEveryDays: 1,
    readHour: 7.5,
    refillAt: 0.3,
    refillTo: 0.85,
    noise: 0.15,
  },
  {
    code: 'GEN-1',
    name: 'Standby generator diesel',
    site: 'Ridge Pump Station',
    product: 'diesel (generator)',
    spec: {
      units: { length: 'in', volume: 'gal' },
      shape: 'horizontal-cylinder',
      diameter: 48,
      length: 96,
      heads: [{ type: 'flat' }, { type: 'flat' }],
    },
    settings: {
      threshold: { percent: 50 },
      leadTimeDays: 2,
      businessDays: true,
      minimumOrder: 500,
      safeFillPercent: 90,
    },
    gauge: { kind: 'level', unit: 'in', step: 0.25 },
    usePerDay: { weekday: 6, weekend: 2 },
    readEveryDays: 3,
    readHour: 9,
    refillAt: 0.55,
    refillTo: 0.88,
    noise: 0.2,
  },
  {
    code: 'BW-1',
    name: 'Backwash waste tank',
    site: 'North Yard',
    product: 'backwash waste',
    spec: { units: { length: 'ft', volume: 'gal' }, shape: 'rectangular', width: 8, length: 10, height: 6 },
    settings: { filling: true, threshold: { percent: 80 }, leadTimeDays: 1, safeFillPercent: 90 },
    gauge: { kind: 'percent', step: 1 },
    usePerDay: { weekday: 420, weekend: 250 },
    readEveryDays: 1,
    readHour: 16,
    refillAt: 0.75,
    refillTo: 0.1,
    noise: 0.6,
  },
  {
    code: 'FERRIC-1',
    name: 'Ferric chloride tote',
    site: 'North Yard',
    product: 'ferric chloride',
    spec: {
      units: { length: 'cm', volume: 'L' },
      shape: 'strapping',
      // An invented calibration chart of a coned-bottom tank: narrow at the bottom, straight above 30 cm.
      table: [
        [0, 0],
        [10, 40],
        [20, 150],
        [30, 330],
        [60, 930],
        [90, 1530],
        [120, 2130],
        [150, 2730],
      ],
    },
    settings: {
      threshold: { volume: 600 },
      leadTimeDays: 5,
      businessDays: true,
      orderIncrement: 250,
      safeFillPercent: 90,
    },
    gauge: { kind: 'level', unit: 'cm', step: 0.5 },
    usePerDay: { weekday: 38, weekend: 30 },
    readEveryDays: 2,
    readHour: 8,
    refillAt: 0.3,
    refillTo: 0.85,
    noise: 0.4,
  },
];
