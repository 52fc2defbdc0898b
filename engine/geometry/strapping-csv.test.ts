import { describe, expect, it } from 'vitest';
import { buildTank, parseStrappingCsv, volumeAtLevel } from './index.js';

const csv = ['level_in,volume_gal', '0,0', '10,55.5', '20,140', '30,240', '40,300'].join('\n');

describe('parseStrappingCsv', () => {
  it('reads units from the header and interpolates linearly between rows', () => {
    const spec = parseStrappingCsv(csv);
    expect(spec.ok && spec.value.units).toEqual({ length: 'in', volume: 'gal' });
    const tank = buildTank(spec.ok ? spec.value : null);
    if (!tank.ok) throw new Error(tank.error);
    // 15 in lies halfway between 55.5 and 140 gal (linear interpolation). 1 in = 0.0254 m, 1 gal = 3.785411784 L (NIST).
    const v = volumeAtLevel(tank.value, 15 * 0.0254);
    expect(v.ok && v.value / 3.785411784).toBeCloseTo(97.75, 9);
    expect(tank.value.capacity / 3.785411784).toBeCloseTo(300, 9);
    expect(tank.value.levelAt(140 * 3.785411784) / 0.0254).toBeCloseTo(20, 9);
  });

  it('takes the units as given when the header has none, and accepts "level (cm)" headers', () => {
    const given = parseStrappingCsv('level,volume\n0,0\n1,10', { length: 'm', volume: 'L' });
    expect(given.ok && given.value.units).toEqual({ length: 'm', volume: 'L' });
    const bracketed = parseStrappingCsv('Level (cm); Volume (litres)\n# maker chart\n0;0\n\n50;400\n');
    expect(bracketed.ok && bracketed.value.table).toEqual([
      [0, 0],
      [50, 400],
    ]);
  });

  it('refuses a level outside the table instead of extrapolating', () => {
    const spec = parseStrappingCsv('level_cm,volume_L\n10,50\n100,900');
    const tank = buildTank(spec.ok ? spec.value : null);
    if (!tank.ok) throw new Error(tank.error);
    const below = volumeAtLevel(tank.value, 0.05);
    expect(below.ok ? '' : below.error).toMatch(
      /outside the strapping table: it must be between 10 and 100 cm/,
    );
    expect(volumeAtLevel(tank.value, 1.01).ok).toBe(false);
    expect(volumeAtLevel(tank.value, 0.1).ok && tank.value.volumeAt(0.1)).toBeCloseTo(50, 9);
  });

  it.each([
    ['', /empty/],
    ['level_in,volume_gal\n0,0', /at least two rows/],
    ['level,volume\n0,0\n1,2', /length unit is missing/],
    ['level_in,volume_furlongs\n0,0\n1,2', /"furlongs" is not a unit/],
    ['level_gal,volume_in\n0,0\n1,2', /"gal" is not a length unit/],
    ['depth,volume_gal\n0,0\n1,2', /header should name the columns level/],
    ['level_in,volume_gal\n0,0\n10,5\n10,6', /line 4: level 10 does not increase/],
    ['level_in,volume_gal\n0,0\n10,5\n20,4', /line 4: volume 4 is below the previous 5/],
    ['level_in,volume_gal\n0,0\n10,five', /line 3: "10,five" is not two numbers/],
    ['level_in,volume_gal\n0,0\n-1,5', /line 3: levels and volumes cannot be negative/],
  ])('explains a bad table %j', (text, message) => {
    const r = parseStrappingCsv(text);
    expect(r.ok ? '' : r.error).toMatch(message);
  });
});
