import { buildTank } from '../../engine/geometry/index.js';
import { fromLitres, fromMetres } from '../../engine/units/index.js';
import type { CommandOf, TankSpecInput } from '../language/command.js';
import { cautionFor } from '../replies/cautions.js';
import { formatNumber, formatVolume } from '../replies/format.js';
import type { Reply } from '../replies/reply.js';
import { findTank } from '../tank-lookup.js';
import { type CommandContext, defineHandler, privateError } from './handler.js';

/** Words in a product name that mean the tank fills and is emptied by a truck (common practice). */
const FILLING_PRODUCTS =
  /\b(waste|backwash|sludge|leachate|produced water|used oil|wastewater|effluent|septage)\b/i;
export const isFillingProduct = (product: string | undefined): boolean =>
  FILLING_PRODUCTS.test(product ?? '');

export interface NewTankRequest {
  code: string;
  spec: TankSpecInput;
  name?: string | undefined;
  product?: string | undefined;
  site?: string | undefined;
  raw: string;
}

function describeSpec(spec: TankSpecInput): string {
  const u = spec.units.length;
  const dims = (['diameter', 'length', 'width', 'height'] as const)
    .filter((k) => spec[k] !== undefined)
    .map((k) => `${k} ${formatNumber(spec[k]!)} ${u}`);
  if (spec.shape === 'strapping') return `strapping table of ${spec.table?.length ?? 0} rows`;
  return `${spec.shape}, ${dims.join(', ')}`;
}

/** Validates the shape with engine/geometry, then stores the tank; the reply states what the bot understood. */
export function createTank(context: CommandContext, req: NewTankRequest): Reply[] {
  const { store, request, now } = context;
  if (findTank(store, request.team, req.code)) {
    return [
      privateError(
        `You already have a tank ${req.code}; choose another code, or \`remove tank ${req.code}\` first.`,
      ),
    ];
  }
  const built = buildTank(req.spec);
  if (!built.ok)
    return [privateError(`${req.code}: ${built.error.replace(/^tank: /, '')}. Nothing was added.`)];
  const tank = store.tanks.add(
    request.team,
    {
      code: req.code,
      spec: req.spec,
      ...(req.name ? { name: req.name } : {}),
      product: req.product ?? null,
      site: req.site ?? null,
      settings: isFillingProduct(req.product) ? { filling: true } : {},
    },
    request.user,
    now,
  );
  store.audit.record(
    request.team,
    {
      userId: request.user,
      action: 'tank.add',
      target: 'tanks',
      targetId: tank.id,
      detail: { raw: req.raw },
    },
    now,
  );
  const g = built.value;
  const { length, volume } = req.spec.units;
  const caution = cautionFor(req.product);
  return [
    {
      kind: 'confirmation',
      visibility: 'channel',
      headline: `Added ${tank.code}: holds ${formatVolume(fromLitres(g.capacity, volume), volume)} at ${formatNumber(fromMetres(g.fullHeight, length))} ${length} full height.`,
      facts: [
        { label: 'Shape', value: describeSpec(req.spec) },
        ...(req.product ? [{ label: 'Product', value: req.product }] : []),
        ...(req.site ? [{ label: 'Site', value: req.site }] : []),
        ...(tank.settings.filling
          ? [{ label: 'Fills', value: 'yes: the plan is a pick-up before it is full' }]
          : []),
        {
          label: 'Next',
          value: `log a reading, e.g. \`${tank.code} ${formatNumber(fromMetres(g.fullHeight / 2, length), 0)}${length}\`; set a threshold with \`set ${tank.code} threshold 20%\``,
        },
      ],
      ...(caution ? { caution } : {}),
    },
  ];
}

export const addTankHandler = defineHandler({
  type: 'add-tank',
  adminOnly: true,
  run: (command: CommandOf<'add-tank'>, context) => {
    const req: NewTankRequest = {
      code: command.tank,
      spec: command.spec,
      name: command.name,
      product: command.product,
      site: command.site,
      raw: command.raw,
    };
    if (!command.awaitingRows) return createTank(context, req);
    if (findTank(context.store, context.request.team, req.code)) return createTank(context, req);
    const { store, request, now } = context;
    store.pending.put({
      teamId: request.team,
      channel: request.channel,
      userId: request.user,
      kind: 'strapping-rows',
      state: { ...req, rows: [] },
      createdAt: now,
    });
    const { length, volume } = command.spec.units;
    return [
      {
        kind: 'question',
        visibility: 'sender',
        headline: `${req.code}: send the strapping table as lines of "level,volume" (level in ${length}, volume in ${volume}), then \`done\`. \`cancel\` stops.`,
        facts: [{ label: 'Example', value: '0,0 / 10,120 / 20,260 (one pair a line)' }],
      },
    ];
  },
});
