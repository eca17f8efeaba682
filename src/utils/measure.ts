import { lengthForDisplay } from '@shared/length-entry';
import type { LengthUnit } from '@shared/units';

/** "742 mm", "29.21 in", "-1.5°": a value with its unit, for read-only displays. */
export function formatMeasure(value: number, unit: 'mm' | 'deg', display: LengthUnit): string {
  if (unit === 'deg') return `${Math.round(value * 10) / 10}°`;
  return `${lengthForDisplay(value, display)} ${display}`;
}
