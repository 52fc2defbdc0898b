import type { Tank as TankGeometry } from '../../engine/geometry/index.js';
import { fail, ok, type Result } from '../../engine/result.js';
import { unknownTankMessage } from '../language/tankName.js';
import type { Tank } from '../store/types.js';
import { findTank, tankNamesOf } from '../tank-lookup.js';
import { geometryOf } from '../tank-rate.js';
import type { CommandContext } from './handler.js';

/** The team's tank a message named, or the "did you mean" error the language part words. */
export function resolveTank({ store, request }: CommandContext, name: string): Result<Tank> {
  const tank = findTank(store, request.team, name);
  if (tank) return ok(tank);
  return fail(unknownTankMessage(name, tankNamesOf(store.tanks.list(request.team))));
}

/** The tank with its built geometry (level <-> volume), or why its stored shape cannot be used. */
export function resolveTankGeometry(
  context: CommandContext,
  name: string,
): Result<{ tank: Tank; geometry: TankGeometry }> {
  const tank = resolveTank(context, name);
  if (!tank.ok) return tank;
  const geometry = geometryOf(tank.value.spec);
  if (!geometry.ok) {
    return fail(
      `${tank.value.code}'s stored shape cannot be used (${geometry.error}); an admin can add the tank again.`,
    );
  }
  return ok({ tank: tank.value, geometry: geometry.value });
}

/** Messages may state a time; one more than a few minutes ahead of the message is a typo, not a plan. */
const FUTURE_SLACK_MS = 10 * 60_000;

export function statedTimeOf(
  context: CommandContext,
  time: { at: number; raw: string } | undefined,
): Result<number> {
  if (!time) return ok(context.now);
  if (time.at > context.now + FUTURE_SLACK_MS) {
    return fail(
      `"${time.raw}" is in the future; give the time the tank was read (times are in ${context.timeZone}).`,
    );
  }
  return ok(time.at);
}
