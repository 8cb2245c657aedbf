// Axis labels in engineering notation: "0", "500 µs", "2 ms", "3.3 V".
import type { Dim } from '../types';
import { formatNumber, formatQuantity } from '../format';

/** The unit written after a number of this dimension ('' for plain counts). */
export function unitOf(dim: Dim): string {
  return dim === '' || dim === 'other' ? '' : dim;
}

/** A tick label; zero is written bare, as on a scope graticule. */
export function tickLabel(value: number, dim: Dim): string {
  if (value === 0) return '0';
  // Counts and 0/1 logic levels read as plain numbers: "0.2", "250", not "200m".
  if (unitOf(dim) === '') return formatNumber(value, 6);
  return formatQuantity(value, unitOf(dim), 4);
}

/** A time axis label in seconds with an SI prefix. */
export function timeLabel(seconds: number): string {
  return tickLabel(seconds, 's');
}
