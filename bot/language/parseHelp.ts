import { fail, ok, type Result } from '../../engine/result.js';
import type { CommandOf, HelpTopic } from './command.js';

const TOPIC_WORDS: Readonly<Record<string, HelpTopic>> = {
  reading: 'readings',
  readings: 'readings',
  read: 'readings',
  level: 'readings',
  levels: 'readings',
  log: 'readings',
  delivery: 'deliveries',
  deliveries: 'deliveries',
  delivered: 'deliveries',
  question: 'questions',
  questions: 'questions',
  ask: 'questions',
  status: 'questions',
  runway: 'questions',
  setup: 'setup',
  add: 'setup',
  tank: 'setup',
  tanks: 'setup',
  strapping: 'setup',
  shape: 'setup',
  shapes: 'setup',
  settings: 'settings',
  setting: 'settings',
  set: 'settings',
  threshold: 'settings',
  digest: 'settings',
  correction: 'corrections',
  corrections: 'corrections',
  undo: 'corrections',
  delete: 'corrections',
  fix: 'corrections',
  unit: 'units',
  units: 'units',
  time: 'times',
  times: 'times',
  dates: 'times',
  zone: 'times',
};

export const HELP_TOPICS = [...new Set(Object.values(TOPIC_WORDS))];

/** "help", "help readings", "?", "help me with units". */
export function parseHelp(text: string): Result<CommandOf<'help'>> | undefined {
  const m = /^(?:help|\?|commands|how\s+do\s+i)\b\s*(?:me\s+)?(?:with\s+|on\s+|about\s+)?(.*?)\s*\??$/i.exec(
    text,
  );
  if (!m) return undefined;
  const words = (m[1] ?? '')
    .toLowerCase()
    .split(/\s+/)
    .filter((w) => w !== '');
  if (words.length === 0) return ok({ type: 'help' });
  for (const word of words) {
    const topic = TOPIC_WORDS[word];
    if (topic) return ok({ type: 'help', topic });
  }
  return fail(
    `I have no help on "${m[1]}"; try \`help\` or one of: ${HELP_TOPICS.map((t) => `help ${t}`).join(', ')}.`,
  );
}
