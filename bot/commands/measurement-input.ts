import type { Measurement } from '../language/command.js';
import type { RawMeasurement } from '../reading-volume.js';

/** A parsed measurement as the store keeps it: the value and unit as typed. */
export function rawMeasurementOf(m: Measurement): RawMeasurement {
  switch (m.kind) {
    case 'level':
    case 'ullage':
      return { kind: m.kind, value: m.length.value, unit: m.length.unit };
    case 'percent':
      return { kind: 'percent', value: m.percent, unit: '%' };
    case 'volume':
      return { kind: 'volume', value: m.volume.value, unit: m.volume.unit };
  }
}

/** "60 in", "48%", "ullage 14 in", "410 gal". */
export function measurementWords(m: RawMeasurement): string {
  if (m.kind === 'percent') return `${m.value}%`;
  return `${m.kind === 'ullage' ? 'ullage ' : ''}${m.value} ${m.unit}`;
}
