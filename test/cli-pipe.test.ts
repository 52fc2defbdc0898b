// The real `node bin/tankrunway.js` writing into a pipe its reader closes early, as `| head` does.
import { spawn } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('..', import.meta.url));
let dir = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-pipe-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('tankrunway output into a pipe closed early', () => {
  it('stops quietly when the reader goes away after the first chunk', async () => {
    // A year of hourly readings: far more JSON than one pipe buffer.
    const lines = ['time,volume,delivered'];
    for (let h = 0; h < 24 * 365; h++) {
      lines.push(`${new Date(Date.UTC(2026, 0, 1) + h * 3_600_000).toISOString()},${9000 - (h % 400) * 10},`);
    }
    const file = join(dir, 'year.csv');
    await writeFile(file, `${lines.join('\n')}\n`);
    const child = spawn(process.execPath, [join(root, 'bin/tankrunway.js'), 'analyze', file, '--json'], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (chunk) => {
      stderr += chunk;
    });
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('close', resolve));
    expect(stderr).not.toMatch(/EPIPE|Error/);
    expect(code).toBe(0);
  }, 60_000);
});
