import type { CliCommand } from '../io.js';

/** Every `tankrunway <command>`; each lives in its own file beside this one. */
export const commands: CliCommand[] = [];
