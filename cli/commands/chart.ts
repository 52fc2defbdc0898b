// `tankrunway chart --tank FILE --step 1 [--json]`: a calibration chart (level -> volume) to print and hang
// by the tank. The CSV form (level_<unit>,volume_<unit>) reads back as a strapping table.
import { parseArgs } from 'node:util';
import { calibrationChart } from '../../engine/geometry/index.js';
import { type CliCommand, UsageError } from '../io.js';
import { isBareNumber } from '../number-list.js';
import { readTankFile } from '../tank-file.js';

export const chartCommand: CliCommand = {
  name: 'chart',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        tank: { type: 'string' },
        step: { type: 'string' },
        json: { type: 'boolean', default: false },
      },
    });
    const stepText = values.step?.trim() ?? '';
    if (!isBareNumber(stepText))
      throw new UsageError("--step is required: a positive number in the tank's length unit");
    const tank = await readTankFile(values.tank);
    const chart = calibrationChart(tank, Number(stepText));
    if (!chart.ok) throw new UsageError(chart.error);
    const { length, volume } = tank.spec.units;
    if (values.json) {
      io.stdout.write(`${JSON.stringify({ lengthUnit: length, volumeUnit: volume, rows: chart.value })}\n`);
      return 0;
    }
    const lines = chart.value.map((row) => `${row.level},${Number(row.volume.toPrecision(8))}`);
    io.stdout.write([`level_${length},volume_${volume}`, ...lines, ''].join('\n'));
    return 0;
  },
};
