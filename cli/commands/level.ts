// `tankrunway level --tank FILE --volumes 1,2,3 [--json]`: volume -> level (cli-contract section 2).
import { parseArgs } from 'node:util';
import { levelAtVolume, type Tank } from '../../engine/geometry/index.js';
import { fromMetres, isVolumeUnit, toLitres } from '../../engine/units/index.js';
import { type CliCommand, UsageError } from '../io.js';
import { type ListedValue, parseNumberList } from '../number-list.js';
import { readTankFile } from '../tank-file.js';

/** A listed volume in litres: a bare number is in the tank's volume unit; a percent is of capacity. */
function volumeInLitres(tank: Tank, entry: ListedValue): number {
  if (entry.unit === null) return toLitres(entry.value, tank.spec.units.volume);
  if (entry.kind === 'percent') {
    if (entry.value < 0 || entry.value > 100)
      throw new UsageError(`--volumes: ${entry.value}% is not between 0 and 100`);
    return (tank.capacity * entry.value) / 100;
  }
  if (entry.kind !== 'volume' || !isVolumeUnit(entry.unit))
    throw new UsageError(`--volumes: ${entry.value} ${entry.unit} is not a volume`);
  return toLitres(entry.value, entry.unit);
}

export const levelCommand: CliCommand = {
  name: 'level',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        tank: { type: 'string' },
        volumes: { type: 'string' },
        json: { type: 'boolean', default: false },
      },
    });
    const entries = parseNumberList(values.volumes, 'volumes');
    const tank = await readTankFile(values.tank);
    const { length, volume } = tank.spec.units;
    const levels = entries.map((entry) => {
      const level = levelAtVolume(tank, volumeInLitres(tank, entry));
      if (!level.ok) throw new UsageError(level.error);
      return fromMetres(level.value, length);
    });
    if (values.json) io.stdout.write(`${JSON.stringify(levels)}\n`);
    else {
      const lines = entries.map(
        (entry, i) =>
          `${entry.value} ${entry.unit ?? volume}: ${Number(levels[i]!.toPrecision(8))} ${length}\n`,
      );
      io.stdout.write(lines.join(''));
    }
    return 0;
  },
};
