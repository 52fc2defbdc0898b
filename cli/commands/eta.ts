// `tankrunway eta --volume 3760 --inflow 1 --outflow 3 --volume-unit gal --flow-unit gal/min [--target 500]
// [--capacity 7520 --target-percent 10] [--tank FILE] [--json]`: static time to a target (cli-contract section 3).
import { parseArgs } from 'node:util';
import { netFlowEta } from '../../engine/forecast/net-flow.js';
import {
  type FlowUnit,
  fromLitres,
  fromLitresPerDay,
  isVolumeUnit,
  parseUnit,
  toLitres,
  toLitresPerDay,
  type VolumeUnit,
} from '../../engine/units/index.js';
import { type CliCommand, UsageError } from '../io.js';
import { isBareNumber, parseListedValue } from '../number-list.js';
import { readTankFile } from '../tank-file.js';

function flowUnitOf(text: string, option: string): FlowUnit {
  const unit = parseUnit(text);
  if (!unit.ok) throw new UsageError(`--${option}: ${unit.error}`);
  if (unit.value.kind !== 'flow')
    throw new UsageError(`--${option}: "${text}" is not a flow (try gal/min, L/h, bbl/d)`);
  return { volume: unit.value.volume, time: unit.value.time };
}

/** A number in the given unit, or a quantity carrying its own unit ("1 gpm", "410 gal"). */
function amount(
  text: string | undefined,
  option: string,
  kind: 'volume' | 'flow',
): { value: number; unit: string | null } | undefined {
  if (text === undefined) return undefined;
  const entry = parseListedValue(text, option);
  if (entry.kind !== null && entry.kind !== kind)
    throw new UsageError(`--${option}: "${text.trim()}" is not a ${kind}`);
  return { value: entry.value, unit: entry.unit };
}

export const etaCommand: CliCommand = {
  name: 'eta',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        volume: { type: 'string' },
        inflow: { type: 'string', default: '0' },
        outflow: { type: 'string' },
        'volume-unit': { type: 'string' },
        'flow-unit': { type: 'string' },
        target: { type: 'string' },
        capacity: { type: 'string' },
        tank: { type: 'string' },
        'target-percent': { type: 'string' },
        json: { type: 'boolean', default: false },
      },
    });
    const volumeIn = amount(values.volume, 'volume', 'volume');
    const outflowIn = amount(values.outflow, 'outflow', 'flow');
    const inflowIn = amount(values.inflow, 'inflow', 'flow')!;
    if (!volumeIn) throw new UsageError('--volume is required (what is in the tank now)');
    if (!outflowIn) throw new UsageError('--outflow is required (what leaves the tank, per unit of time)');

    const flowUnitText = values['flow-unit'] ?? outflowIn.unit ?? inflowIn.unit;
    if (!flowUnitText)
      throw new UsageError('--flow-unit is required for bare flow numbers (e.g. gal/min, L/h)');
    const flowUnit = flowUnitOf(flowUnitText, 'flow-unit');
    // A tank file gives the capacity and the volume unit unless they are given here.
    const tank = values.tank === undefined ? null : await readTankFile(values.tank);
    const volumeUnitText =
      values['volume-unit'] ?? volumeIn.unit ?? tank?.spec.units.volume ?? flowUnit.volume;
    const volumeUnit = parseUnit(volumeUnitText);
    if (!volumeUnit.ok || volumeUnit.value.kind !== 'volume' || !isVolumeUnit(volumeUnit.value.unit))
      throw new UsageError(
        `--volume-unit "${volumeUnitText}" is not a volume unit (L, m3, gal, impgal, bbl, ft3, in3)`,
      );
    const unit: VolumeUnit = volumeUnit.value.unit;

    const litres = (a: { value: number; unit: string | null }) =>
      toLitres(a.value, (a.unit as VolumeUnit | null) ?? unit);
    const perDay = (a: { value: number; unit: string | null }) =>
      toLitresPerDay(a.value, a.unit === null ? flowUnit : flowUnitOf(a.unit, 'flow'));
    const capacityIn = amount(values.capacity, 'capacity', 'volume');
    const targetIn = amount(values.target, 'target', 'volume');
    const percent = values['target-percent'];
    if (targetIn && percent !== undefined)
      throw new UsageError('give --target or --target-percent, not both');
    const capacity = capacityIn ? litres(capacityIn) : tank ? tank.capacity : undefined;
    let target = targetIn ? litres(targetIn) : undefined;
    if (percent !== undefined) {
      const p = Number(percent);
      if (!isBareNumber(percent) || !(p >= 0 && p <= 100))
        throw new UsageError('--target-percent must be a number from 0 to 100');
      if (capacity === undefined) throw new UsageError('--target-percent needs --capacity or --tank');
      target = (capacity * p) / 100;
    }
    const eta = netFlowEta({
      volume: litres(volumeIn),
      inflow: perDay(inflowIn),
      outflow: perDay(outflowIn),
      ...(target !== undefined ? { target } : {}),
      ...(capacity !== undefined ? { capacity } : {}),
    });
    if (!eta.ok) throw new UsageError(eta.error);
    const e = eta.value;
    // 12 significant digits: the unit round trip through litres per day leaves binary noise in the last ones.
    const tidy = (x: number | null) => (x === null ? null : Number(x.toPrecision(12)));
    const out = {
      netOutflow: tidy(fromLitresPerDay(e.netOutflow, flowUnit))!,
      hours: tidy(e.days === null ? null : e.days * 24),
      days: tidy(e.days),
      state: e.state,
      target: tidy(fromLitres(e.target, unit)),
      hoursToFull: tidy(e.daysToFull === null ? null : e.daysToFull * 24),
      daysToFull: tidy(e.daysToFull),
      volumeUnit: unit,
      flowUnit: `${flowUnit.volume}/${flowUnit.time}`,
      message: e.message,
    };
    if (values.json) io.stdout.write(`${JSON.stringify(out)}\n`);
    else {
      const hours =
        out.hours === null
          ? ''
          : ` (${Number(out.hours.toPrecision(4))} h, ${Number(out.days!.toPrecision(4))} d)`;
      io.stdout.write(
        `net outflow ${Number(out.netOutflow.toPrecision(6))} ${out.flowUnit}: ${e.message}${hours}\n`,
      );
    }
    return 0;
  },
};
