import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runInProcess as run } from '../test/fixtures/geometry/run-cli.js';
import { loadTankFile, readTankFile } from './tank-file.js';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-tankfile-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const write = async (name: string, text: string) => {
  const path = join(dir, name);
  await writeFile(path, text);
  return path;
};

describe('loadTankFile', () => {
  it('reads the tank JSON and a strapping CSV', async () => {
    const json = await loadTankFile(
      await write('t.json', '{"units":{"length":"m","volume":"L"},"shape":"sphere","diameter":2}'),
    );
    expect(json.ok && json.value.fullHeight).toBe(2);
    const csv = await loadTankFile(await write('t.csv', 'level_cm,volume_L\n0,0\n100,500\n'));
    expect(csv.ok && csv.value.capacity).toBe(500);
  });

  it.each([
    ['missing.json', null, /missing.json: no such file/],
    ['bad.json', '{"units": {', /bad.json is not valid JSON/],
    [
      'shape.json',
      '{"units":{"length":"m","volume":"L"},"shape":"sphere","diameter":"2"}',
      /shape.json: diameter must be a positive number of m/,
    ],
    ['table.csv', 'level_cm,volume_L\n0,0\n0,5\n', /table.csv: line 3: level 0 does not increase/],
  ])('names the file and the problem: %s', async (name, text, message) => {
    const path = text === null ? join(dir, name) : await write(name, text);
    const r = await loadTankFile(path);
    expect(r.ok ? '' : r.error).toMatch(message);
    await expect(readTankFile(path)).rejects.toThrow(message);
  });

  it('makes a command exit 2 with one line, for a missing --tank too', async () => {
    const bad = await write('broken.json', 'not json');
    for (const args of [
      ['volume', '--tank', bad, '--levels', '1'],
      ['volume', '--levels', '1'],
    ]) {
      const r = await run(args);
      expect(r.code).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    }
  });
});
