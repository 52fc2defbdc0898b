// The fortnight of the end-to-end test: the messages a script types, and what their words mean.
import type { LengthUnit } from '../../engine/units/index.js';

/** Denver is on MST (UTC-7) all fortnight: daylight time ended on 1 Nov 2026. */
export const GEN1_SPEC = {
  units: { length: 'in', volume: 'gal' },
  shape: 'vertical-cylinder',
  diameter: 48,
  length: 72,
};

/** GEN-1's readings as the script types them, with the instant each one's words mean. */
export const GEN1: {
  now: string;
  text: string;
  at: string;
  value: number;
  unit: LengthUnit;
  ullage?: boolean;
}[] = [
  { now: '2026-11-02T15:00Z', text: 'GEN-1 40in at 7:30', at: '2026-11-02T14:30Z', value: 40, unit: 'in' },
  {
    now: '2026-11-03T15:00Z',
    text: 'GEN-1 38.9in at 7:30',
    at: '2026-11-03T14:30Z',
    value: 38.9,
    unit: 'in',
  },
  {
    now: '2026-11-04T15:00Z',
    text: `GEN-1 3' 1.8" at 7:30`,
    at: '2026-11-04T14:30Z',
    value: 37.8,
    unit: 'in',
  },
  {
    now: '2026-11-05T15:00Z',
    text: 'GEN-1 95cm yesterday 4pm',
    at: '2026-11-04T23:00Z',
    value: 95,
    unit: 'cm',
  },
  {
    now: '2026-11-06T15:00Z',
    text: 'GEN-1 35.6in 2 hours ago',
    at: '2026-11-06T13:00Z',
    value: 35.6,
    unit: 'in',
  },
  {
    now: '2026-11-07T15:00Z',
    text: 'GEN-1 34.5in at 7:30',
    at: '2026-11-07T14:30Z',
    value: 34.5,
    unit: 'in',
  },
  {
    now: '2026-11-09T15:00Z',
    text: 'GEN-1 51.4in at 7:30',
    at: '2026-11-09T14:30Z',
    value: 51.4,
    unit: 'in',
  },
  { now: '2026-11-10T15:00Z', text: 'GEN-1 1.28m at 7:30', at: '2026-11-10T14:30Z', value: 1.28, unit: 'm' },
  {
    now: '2026-11-11T15:00Z',
    text: 'GEN-1 49.2in at 7:30',
    at: '2026-11-11T14:30Z',
    value: 49.2,
    unit: 'in',
  },
  {
    now: '2026-11-12T15:00Z',
    text: 'GEN-1 ullage 23.9in',
    at: '2026-11-12T15:00Z',
    value: 23.9,
    unit: 'in',
    ullage: true,
  },
  { now: '2026-11-13T15:00Z', text: 'GEN-1 47in at 7:30', at: '2026-11-13T14:30Z', value: 47, unit: 'in' },
  {
    now: '2026-11-14T15:00Z',
    text: 'GEN-1 45.9in at 7:30',
    at: '2026-11-14T14:30Z',
    value: 45.9,
    unit: 'in',
  },
];
export const GEN1_DELIVERY = {
  now: '2026-11-08T18:00Z',
  text: 'delivered 150 gal to GEN-1 at 10:00',
  at: '2026-11-08T17:00Z',
};

export const SETUP = [
  'add tank GEN-1 vertical-cylinder diameter=48in length=72in unit=gal product=diesel site="Ridge Pump Station"',
  'add tank HYPO-1 horizontal-cylinder diameter=1.2m length=2.5m unit=L product="sodium hypochlorite 12.5%" site="Mill Creek Lift Station"',
  'add tank T9 strapping unit=L level=cm product="ferric chloride" site="North Yard"',
  '0,0',
  '30,300',
  '60,700',
  '90,1100\n',
  '120,1500',
  '150,1900',
  'done',
];

/** The other tanks' days, interleaved by instant with GEN-1's. */
export const OTHERS: { now: string; text: string }[] = [
  { now: '2026-11-02T15:10Z', text: 'HYPO-1 62% at 8am' },
  { now: '2026-11-02T16:10Z', text: 'T9 120cm at 9:00' },
  { now: '2026-11-04T15:10Z', text: 'HYPO-1 59% at 8:00' },
  { now: '2026-11-05T16:10Z', text: 'T9 ullage 45cm at 9am' },
  { now: '2026-11-06T15:10Z', text: 'HYPO-1 1560 L at 8:00' },
  { now: '2026-11-08T16:10Z', text: 'T9 1250 L' },
  { now: '2026-11-10T15:05Z', text: 'GEN1 50in' }, // a typo: caught, nothing stored
  { now: '2026-11-10T15:10Z', text: 'HYPO-1 53% at 8:00' },
  { now: '2026-11-11T15:10Z', text: 'HYPO-1 86% at 8:00' }, // a delivery nobody logged: the engine finds it
  { now: '2026-11-12T16:10Z', text: 'T9 88cm at 9:00' },
  { now: '2026-11-13T15:10Z', text: 'HYPO-1 84% at 8:00' },
  { now: '2026-11-13T15:20Z', text: 'GEN-1 44in at 8:15' }, // a slip of the reader: the bot asks...
  { now: '2026-11-13T15:21Z', text: 'undo' }, // ...taken back
  { now: '2026-11-14T15:10Z', text: 'HYPO-1 82% at 8:00' },
];

export const QUESTIONS_AT = '2026-11-15T16:00Z';
export const QUESTIONS = ['GEN-1?', 'how long does HYPO-1 last?', 'which tanks run low this week?', 'all'];

export function script(): string[] {
  const timed = [
    ...GEN1.map((r) => ({ now: r.now, text: r.text })),
    GEN1_DELIVERY,
    ...OTHERS,
    ...QUESTIONS.map((text) => ({ now: QUESTIONS_AT, text })),
  ].sort((a, b) => Date.parse(a.now) - Date.parse(b.now));
  const lines = ['/now 2026-11-01T20:00Z', ...SETUP];
  let clock = '';
  for (const step of timed) {
    if (step.now !== clock) lines.push(`/now ${step.now}`);
    clock = step.now;
    lines.push(step.text);
  }
  return lines;
}
