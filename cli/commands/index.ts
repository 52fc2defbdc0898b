import type { CliCommand } from '../io.js';
import { analyzeCommand } from './analyze.js';
import { chartCommand } from './chart.js';
import { chatCommand } from './chat.js';
import { etaCommand } from './eta.js';
import { levelCommand } from './level.js';
import { serveCommand } from './serve.js';
import { volumeCommand } from './volume.js';

/** Every `tankrunway <command>`; each lives in its own file beside this one. */
export const commands: CliCommand[] = [
  analyzeCommand,
  chatCommand,
  volumeCommand,
  levelCommand,
  etaCommand,
  chartCommand,
  serveCommand,
];
