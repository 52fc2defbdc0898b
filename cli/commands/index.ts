import type { CommandEntry } from '../io.js';

/**
 * Every `tankrunway <command>`; each lives in its own file beside this one and is loaded only when run, so
 * `volume` does not pay for the chat platforms' libraries.
 */
export const commands: CommandEntry[] = [
  {
    name: 'analyze',
    summary:
      'rate, runway and events of a readings CSV: FILE [--tank FILE] [--volume-unit U] [--target N] --json',
    load: async () => (await import('./analyze.js')).analyzeCommand,
  },
  {
    name: 'chat',
    summary:
      'talk to the bot in this terminal (one message a line when piped): --db FILE [--demo] [--user NAME]',
    load: async () => (await import('./chat.js')).chatCommand,
  },
  {
    name: 'serve',
    summary:
      'run the bot on Slack and/or Discord (settings from the environment) or this terminal: --db FILE',
    load: async () => (await import('./serve.js')).serveCommand,
  },
  {
    name: 'volume',
    summary: 'volume at each level (or ullage) of a tank: --tank FILE --levels 0.1,0.5',
    load: async () => (await import('./volume.js')).volumeCommand,
  },
  {
    name: 'level',
    summary: 'level at each volume of a tank: --tank FILE --volumes 100,250',
    load: async () => (await import('./level.js')).levelCommand,
  },
  {
    name: 'eta',
    summary: 'time until a volume runs down at a steady inflow and outflow',
    load: async () => (await import('./eta.js')).etaCommand,
  },
  {
    name: 'chart',
    summary: 'calibration chart of a tank, level -> volume at a step: --tank FILE --step 1',
    load: async () => (await import('./chart.js')).chartCommand,
  },
];
