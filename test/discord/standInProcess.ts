/** Starts test/discord/standInChild.ts in a child process and talks to it (see there for why). */
import { type ChildProcess, spawn } from 'node:child_process';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';

export interface ChildCall {
  method: string;
  path: string;
  at: number;
  limited: boolean;
  type?: number;
}

export interface StandInProcess {
  gatewayUrl: string;
  apiUrl: string;
  calls: ChildCall[];
  dispatch(type: string, data: unknown): void;
  stop(): Promise<void>;
}

export async function startStandInProcess(applicationId: string): Promise<StandInProcess> {
  const entry = fileURLToPath(new URL('./standInChild.ts', import.meta.url));
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', entry, applicationId], {
    stdio: ['pipe', 'pipe', 'inherit'],
  });
  const calls: ChildCall[] = [];
  const lines = createInterface({ input: child.stdout as NodeJS.ReadableStream });
  const urls = await new Promise<{ gatewayUrl: string; apiUrl: string }>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`stand-in process exited with ${code}`)));
    lines.on('line', (line) => {
      const message = JSON.parse(line) as {
        ready?: boolean;
        gatewayUrl: string;
        apiUrl: string;
        call?: ChildCall;
      };
      if (message.ready) resolve(message);
      if (message.call) calls.push(message.call);
    });
  });
  return {
    ...urls,
    calls,
    dispatch(type, data) {
      child.stdin?.write(`${JSON.stringify({ dispatch: { type, data } })}\n`);
    },
    stop: () =>
      new Promise<void>((resolve) => {
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}
