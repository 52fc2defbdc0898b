import type { Readable, Writable } from 'node:stream';

/** The streams a CLI command talks to; tests pass in-memory ones. */
export interface CliIo {
  stdout: Pick<Writable, 'write'>;
  stderr: Pick<Writable, 'write'>;
  stdin: Readable;
}

/** A bad input the user can fix: reported as one line on stderr with exit code 2. */
export class UsageError extends Error {}

export interface CliCommand {
  name: string;
  /** Returns the process exit code. Throw UsageError for input the user must fix. */
  run(argv: string[], io: CliIo): Promise<number>;
}

/** A registry entry: what `--help` shows, and how to load the command when it is run. */
export interface CommandEntry {
  name: string;
  summary: string;
  load(): Promise<CliCommand>;
}
