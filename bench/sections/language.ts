// How fast the bot's language reads a message (it runs on every message), against chrono-node reading
// only the time words of such messages (the library step a timed message needs anyway), in the same run.
import * as chrono from 'chrono-node';
import { exampleContext } from '../../bot/language/exampleContext.js';
import { parseMessage } from '../../bot/language/index.js';
import { type BenchSection, opsPerSecond, percentile } from '../harness.js';

const MESSAGES = [
  'T4 60in',
  `T4 5' 2" yesterday 4pm`,
  'T4 48% at 7:30',
  'North Yard 2 1,550 L at 2026-11-02 07:30',
  'delivered 150 gal to T4 ticket 8812 level after 61in at 2026-11-06 10:00',
  'T4?',
  'how long does T4 last?',
  'which tanks run low this week?',
  'add tank T5 vertical-cylinder diameter=48in length=72in unit=gal heads=ellipsoidal:6in,flat',
  'set T4 lead time 3 business days cutoff 14:00',
  'T5 60in',
];

/** The time words of the timed messages above, as the parser hands them to chrono-node. */
const TIME_WORDS = ['yesterday 4pm', 'at 7:30', 'at 2026-11-02 07:30', 'at 2026-11-06 10:00'];

function latenciesMicros(fn: (text: string) => unknown, texts: readonly string[], rounds: number): number[] {
  const out: number[] = [];
  for (let r = 0; r < rounds; r++) {
    for (const text of texts) {
      const start = process.hrtime.bigint();
      fn(text);
      out.push(Number(process.hrtime.bigint() - start) / 1000);
    }
  }
  return out;
}

export const languageSection: BenchSection = {
  title: 'bot language: parseMessage',
  async run() {
    // America/Chicago is UTC-6 at the example context's instant.
    const reference = { instant: new Date(exampleContext.now), timezone: -360 };
    const chronoOnly = (text: string) => chrono.parse(text, reference).length;
    const parse = (text: string) => (parseMessage(text, exampleContext).ok ? 1 : 0);
    // Warm both up first: chrono-node compiles its patterns on first use, which is not the steady state.
    for (let i = 0; i < 200; i++) {
      chronoOnly(TIME_WORDS[i % TIME_WORDS.length] ?? '');
      parse(MESSAGES[i % MESSAGES.length] ?? '');
    }
    const baselineName = 'chrono-node alone on time words';
    const baselineOps = opsPerSecond((i) => chronoOnly(TIME_WORDS[i % TIME_WORDS.length] ?? ''));
    const parseOps = opsPerSecond((i) => parse(MESSAGES[i % MESSAGES.length] ?? ''));
    const baselineP99 = percentile(latenciesMicros(chronoOnly, TIME_WORDS, 500), 99);
    const parseP99 = percentile(latenciesMicros(parse, MESSAGES, 200), 99);
    return [
      {
        name: 'messages parsed (mixed forms)',
        value: parseOps,
        unit: 'ops/s',
        baseline: { name: baselineName, value: baselineOps },
      },
      {
        name: 'one message, p99',
        value: parseP99,
        unit: 'µs',
        baseline: { name: baselineName, value: baselineP99 },
      },
    ];
  },
};
