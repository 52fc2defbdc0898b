import type { BenchSection } from '../harness.js';
import { chartsSection } from './charts.js';
import { digestSection } from './digest.js';
import { discordLoadSection } from './discord-load.js';
import { geometrySection } from './geometry.js';
import { languageSection } from './language.js';
import { rateSection } from './rate.js';
import { refillSection } from './refill.js';
import { replyLatencySection } from './reply-latency.js';
import { slackLoadSection } from './slack-load.js';

/** Every section of `npm run bench`, in print order; each lives in its own file beside this one. */
export const sections: BenchSection[] = [
  languageSection,
  slackLoadSection,
  chartsSection,
  discordLoadSection,
  geometrySection,
  rateSection,
  refillSection,
  replyLatencySection,
  digestSection,
];
