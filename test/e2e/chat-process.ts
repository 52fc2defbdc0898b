// Runs the real `tankrunway chat` (bin/tankrunway.js over the compiled dist/) as a child process, the way a
// script would: one message a line on stdin, plain replies on stdout.
import { type ChildProcessWithoutNullStreams, spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = `${ROOT}bin/tankrunway.js`;

export function startChat(args: string[]): ChildProcessWithoutNullStreams {
  return spawn(process.execPath, [BIN, 'chat', ...args], { cwd: ROOT, stdio: 'pipe' });
}

/** Sends every line, closes stdin, and resolves with stdout, stderr and the exit code. */
export function runChat(
  args: string[],
  lines: string[],
): Promise<{ stdout: string; stderr: string; code: number | null }> {
  return new Promise((resolve, reject) => {
    const child = startChat(args);
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (c: string) => {
      stdout += c;
    });
    child.stderr.setEncoding('utf8').on('data', (c: string) => {
      stderr += c;
    });
    child.on('error', reject);
    child.on('close', (code) => resolve({ stdout, stderr, code }));
    child.stdin.end(`${lines.join('\n')}\n`);
  });
}

/** The plain-text replies of a run: blocks separated by a blank line. */
export const replyBlocks = (stdout: string): string[] => stdout.split('\n\n').filter((b) => b.trim() !== '');

/** "Label:  value" from a block. */
export function factOf(block: string | undefined, label: string): string | undefined {
  const line = block?.split('\n').find((l) => l.startsWith(`${label}:`));
  return line?.slice(label.length + 1).trim();
}
