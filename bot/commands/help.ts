import type { HelpTopic } from '../language/command.js';
import type { Reply } from '../replies/reply.js';
import { defineHandler } from './handler.js';

/** Examples per topic, in the bot's own words; each line is a message the bot accepts. */
const TOPICS: Record<HelpTopic, { title: string; examples: [string, string][] }> = {
  readings: {
    title: 'Log a reading',
    examples: [
      ['T4 60in', 'a level from the bottom, now'],
      ['T4 52.3in at 7:30', 'at a time today in your zone'],
      ['T4 48% yesterday 4pm', 'a percent gauge, in the past'],
      ['T4 ullage 14in', 'space above the liquid, from the top'],
      ['T4 410 gal', 'a volume from a meter or sensor'],
    ],
  },
  deliveries: {
    title: 'Log a delivery',
    examples: [
      ['delivered 150 gal to T4', 'a delivery now'],
      ['T4 +400 gal ticket 8812', 'with the ticket number'],
      ['delivered 400 gal to T4 at 10:00 level 61in', 'with the level read after it'],
    ],
  },
  questions: {
    title: 'Ask',
    examples: [
      ['T4?', 'volume, rate, runway and when to order'],
      ['how long does T4 last?', 'the same, in words'],
      ['which tanks run low this week?', 'tanks whose runway ends soon'],
      ['all', 'every tank in one table'],
    ],
  },
  setup: {
    title: 'Set up a tank (admins)',
    examples: [
      ['add tank T4 vertical-cylinder diameter=48in length=72in unit=gal', 'one line'],
      ['add tank T9 strapping unit=L', 'then paste "level,volume" lines, then `done`'],
      ['add tank', 'a guided setup, one question at a time'],
      ['rename T4 to Gen-1', 'a new code'],
      ['remove tank T4', 'history is kept for the audit trail'],
    ],
  },
  settings: {
    title: 'Settings (admins)',
    examples: [
      ['set T4 threshold 20%', 'order before the tank reaches 20%'],
      ['set T4 lead time 3 business days', 'days from order to delivery'],
      ['set T4 delivery days tue,thu', 'when the supplier delivers'],
      ['set T4 delivery hours 8-12', 'the hours a delivery arrives in'],
      ['set T4 safe fill 90%', 'fill no higher than this'],
      ['set time zone America/Chicago', 'the team’s zone (UTC until set)'],
      ['set digest 07:00 weekdays here', 'a morning summary in this channel'],
    ],
  },
  corrections: {
    title: 'Fix a mistake',
    examples: [
      ['undo', 'remove your last reading or delivery'],
      ['delete the 7:30 reading', 'remove a reading by its time'],
      ['that was cm', 'your last reading’s unit was wrong'],
    ],
  },
  units: {
    title: 'Units',
    examples: [
      ['62in, 5\' 2", 1.57m, 157cm', 'levels'],
      ['410 gal, 1550 L, 9.8 bbl, 1.55 m3', 'volumes'],
      ['48%', 'percent of capacity'],
    ],
  },
  times: {
    title: 'Times (in the team’s zone unless you give one)',
    examples: [
      ['at 7:30', 'today'],
      ['yesterday 4pm', 'in words'],
      ['at 2026-11-02 07:30', 'a date and time'],
    ],
  },
};

const OVERVIEW: HelpTopic[] = ['readings', 'deliveries', 'questions', 'corrections', 'setup', 'settings'];

const MORE: HelpTopic[] = ['units', 'times', 'settings', 'corrections'];

export function helpReply(topic?: HelpTopic): Reply {
  const topics = topic ? [topic] : OVERVIEW;
  const rows = topics.flatMap((t) =>
    TOPICS[t].examples.map(([message, meaning]) => [TOPICS[t].title, message, meaning]),
  );
  return {
    kind: 'help',
    visibility: 'sender',
    headline: topic
      ? `${TOPICS[topic].title}: examples`
      : 'tank-runway logs tank readings and tells you how long each tank lasts and when to order. Examples:',
    table: { columns: ['', 'message', 'what it does'], rows },
    // The pointer to further topics comes after the table (actions render last), so "Examples:" leads
    // straight into the examples.
    ...(topic ? {} : { actions: MORE.map((t) => ({ label: `More: ${t}`, command: `help ${t}` })) }),
  };
}

export const helpHandler = defineHandler({
  type: 'help',
  run: (command) => [helpReply(command.topic)],
});
