// `tankrunway volume --tank FILE --levels 0.1,0.5,1.2 [--json]`: level -> volume (cli-contract section 2).
// `--ullages` instead of `--levels` reads distances measured down from the top (or from --reference).
import { parseArgs } from 'node:util';
import { levelFromUllage, type Tank, volumeAtLevel } from '../../engine/geometry/index.js';
import { fromLitres, fromMetres, isLengthUnit, toMetres } from '../../engine/units/index.js';
import { type CliCommand, UsageError } from '../io.js';
import { type ListedValue, parseNumberList } from '../number-list.js';
import { readTankFile } from '../tank-file.js';

/** A listed length in metres: a bare number is in the tank's length unit. */
export function lengthInMetres(tank: Tank, entry: ListedValue, option: string): number {
  if (entry.unit === null) return toMetres(entry.value, tank.spec.units.length);
  if (entry.kind !== 'length' || !isLengthUnit(entry.unit))
    throw new UsageError(`--${option}: ${entry.value} ${entry.unit} is not a length`);
  return toMetres(entry.value, entry.unit);
}

export const volumeCommand: CliCommand = {
  name: 'volume',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        tank: { type: 'string' },
        levels: { type: 'string' },
        ullages: { type: 'string' },
        reference: { type: 'string' },
        json: { type: 'boolean', default: false },
      },
    });
    if ((values.levels === undefined) === (values.ullages === undefined))
      throw new UsageError(
        'give --levels (measured up from the bottom) or --ullages (measured down from the top)',
      );
    const tank = await readTankFile(values.tank);
    const { length, volume } = tank.spec.units;
    const reference =
      values.reference === undefined
        ? tank.fullHeight
        : lengthInMetres(tank, parseNumberList(values.reference, 'reference')[0]!, 'reference');
    const levels =
      values.levels !== undefined
        ? parseNumberList(values.levels, 'levels').map((e) => lengthInMetres(tank, e, 'levels'))
        : parseNumberList(values.ullages, 'ullages').map((e) => {
            const level = levelFromUllage(tank, lengthInMetres(tank, e, 'ullages'), reference);
            if (!level.ok) throw new UsageError(level.error);
            return level.value;
          });
    const volumes = levels.map((level) => {
      const litres = volumeAtLevel(tank, level);
      if (!litres.ok) throw new UsageError(litres.error);
      return fromLitres(litres.value, volume);
    });
    if (values.json) io.stdout.write(`${JSON.stringify(volumes)}\n`);
    else {
      const lines = levels.map(
        (level, i) =>
          `${Number(fromMetres(level, length).toPrecision(10))} ${length}: ${Number(volumes[i]!.toPrecision(8))} ${volume}\n`,
      );
      io.stdout.write(lines.join(''));
    }
    return 0;
  },
};
