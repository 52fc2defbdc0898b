import { describe, expect, it } from 'vitest';
import { buildTank } from '../../engine/geometry/index.js';
import { fromLitres } from '../../engine/units/index.js';
import { commandOf } from './exampleContext.js';

/** The spec an `add tank` line parses to is one engine/geometry builds, with the volume the words describe. */
describe('add tank lines build real tanks', () => {
  const built = (line: string) => {
    const command = commandOf(line);
    if (command.type !== 'add-tank') throw new Error(`${line} is a ${command.type}`);
    const tank = buildTank(command.spec);
    if (!tank.ok) throw new Error(tank.error);
    return { tank: tank.value, unit: command.spec.units.volume };
  };

  it('a 48 in x 72 in vertical cylinder holds pi * 24^2 * 72 in^3 = 564.02 US gal (1 gal = 231 in^3, NIST Handbook 44 appendix C)', () => {
    const { tank, unit } = built('add tank T5 vertical-cylinder diameter=48in length=72in unit=gal');
    expect(fromLitres(tank.capacity, unit)).toBeCloseTo((Math.PI * 24 ** 2 * 72) / 231, 6);
    expect(fromLitres(tank.capacity, unit)).toBeCloseTo(564.02, 2);
  });

  it('mixed dimension units give the same tank as one unit', () => {
    const mixed = built('add tank T5 horizontal diameter=4ft length=96in unit=gal');
    const same = built('add tank T6 horizontal diameter=48in length=96in unit=gal');
    expect(mixed.tank.capacity).toBeCloseTo(same.tank.capacity, 9);
  });

  it.each([
    'add tank T7 horizontal-cylinder diameter=2m length=5m heads=ellipsoidal:0.5m unit=m3',
    'add tank T7 vertical d=3m len=4m heads=conical:30cm:inward,torispherical:f=1:k=0.06 unit=L',
    'add tank T7 sphere diameter=3m unit=m3',
    'add tank T7 box width=1.2m length=2m height=1500mm unit=L',
    'add tank T7 strapping unit=L\n0,0\n50,400\n100,900',
    'add tank T7 strapping unit=gal\nlevel_in,volume_gal\n0,0\n24,150\n48,310',
  ])('%s', (line) => {
    const { tank } = built(line);
    expect(tank.capacity).toBeGreaterThan(0);
    expect(tank.fullHeight).toBeGreaterThan(0);
  });

  it('a sphere of 3 m holds 4/3 pi 1.5^3 = 14.137 m3 (sphere volume, any geometry handbook)', () => {
    const { tank, unit } = built('add tank T7 sphere diameter=3m unit=m3');
    expect(fromLitres(tank.capacity, unit)).toBeCloseTo((4 / 3) * Math.PI * 1.5 ** 3, 6);
  });
});
