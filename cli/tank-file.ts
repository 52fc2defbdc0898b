// Reads a tank file for the CLI: the tank JSON of the contract, or a strapping table as CSV (.csv).
import { readFile } from 'node:fs/promises';
import { buildTank, parseStrappingCsv, type Tank } from '../engine/geometry/index.js';
import { fail, type Result } from '../engine/result.js';
import { UsageError } from './io.js';

/** The Tank described by a file; every problem (missing file, bad JSON, bad shape) is a message naming the file. */
export async function loadTankFile(path: string): Promise<Result<Tank>> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const why =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : 'it cannot be read';
    return fail(`tank file ${path}: ${why}`);
  }
  if (/\.csv$/i.test(path)) {
    const spec = parseStrappingCsv(text);
    if (!spec.ok) return fail(`tank file ${path}: ${spec.error}`);
    return buildTank(spec.value);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return fail(`tank file ${path} is not valid JSON (${(error as Error).message.split('\n')[0]})`);
  }
  const tank = buildTank(json);
  return tank.ok ? tank : fail(`tank file ${path}: ${tank.error.replace(/^tank: /, '')}`);
}

/** As loadTankFile, for a command: a problem becomes a UsageError (exit code 2, one line). */
export async function readTankFile(path: string | undefined): Promise<Tank> {
  if (path === undefined || path === '')
    throw new UsageError('--tank FILE is required (the tank JSON, or a strapping CSV)');
  const tank = await loadTankFile(path);
  if (!tank.ok) throw new UsageError(tank.error);
  return tank.value;
}
