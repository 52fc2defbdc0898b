import type { CliCommand } from '../io.js';
import { analyzeCommand } from './analyze.js';

/** Every `tankrunway <command>`; each lives in its own file beside this one. */
export const commands: CliCommand[] = [analyzeCommand];
