// The time and values under the mouse, read from the posted samples rather than from the drawing.
import type { Trace } from '../core/circuits/model';
import { tickLabel, timeLabel, unitOf } from '../core/wave/labels';
import type { ChartGeometry } from './chart';

/**
 * A trace's value at time t: linear between samples, and at a jump (two samples at one instant) the value
 * after it. Samples are in time order, as the models emit them. Undefined outside the sampled span.
 */
export function valueAt(points: ReadonlyArray<[number, number]>, t: number): number | undefined {
  if (points.length === 0 || !(t >= points[0][0]) || t > points[points.length - 1][0]) return undefined;
  let low = 0;
  let high = points.length - 1;
  while (low < high) {
    const mid = (low + high + 1) >> 1;
    if (points[mid][0] <= t) low = mid;
    else high = mid - 1;
  }
  const [t0, v0] = points[low];
  const next = points[low + 1];
  if (!next || next[0] <= t0) return Number.isFinite(v0) ? v0 : undefined;
  const value = v0 + ((t - t0) / (next[0] - t0)) * (next[1] - v0);
  return Number.isFinite(value) ? value : undefined;
}

/** A reading keeps its unit at zero too ("0 V"), unlike an axis tick. */
function reading(value: number, dim: Trace['dim']): string {
  return value === 0 && unitOf(dim) ? `0 ${unitOf(dim)}` : tickLabel(value, dim);
}

export function readoutText(traces: readonly Trace[], t: number): string {
  const parts = [`t = ${t === 0 ? '0 s' : timeLabel(t)}`];
  for (const trace of traces) {
    const value = valueAt(trace.points, t);
    if (value !== undefined) parts.push(`${trace.name} ${reading(value, trace.dim)}`);
  }
  return parts.join(' · ');
}

/** Follows the mouse over the plot with a cursor line and writes the readout. Returns the remover. */
export function attachReadout(chart: ChartGeometry, traces: readonly Trace[], out: HTMLElement, idle: string): () => void {
  const { svg, left, right, duration, frames } = chart;
  const cursor = document.createElementNS('http://www.w3.org/2000/svg', 'line');
  cursor.setAttribute('class', 'cursor');
  cursor.setAttribute('y1', String(frames[0].top));
  cursor.setAttribute('y2', String(frames[frames.length - 1].bottom));
  cursor.setAttribute('visibility', 'hidden');
  svg.appendChild(cursor);
  const move = (event: PointerEvent): void => {
    const box = svg.getBoundingClientRect();
    // The SVG is drawn at its own pixel size, so client pixels map 1:1 after the box offset.
    const x = ((event.clientX - box.left) * svg.width.baseVal.value) / Math.max(1, box.width);
    if (x < left || x > right) return leave();
    const t = ((x - left) / (right - left)) * duration;
    cursor.setAttribute('x1', x.toFixed(1));
    cursor.setAttribute('x2', x.toFixed(1));
    cursor.setAttribute('visibility', 'visible');
    out.textContent = readoutText(traces, t);
  };
  const leave = (): void => {
    cursor.setAttribute('visibility', 'hidden');
    out.textContent = idle;
  };
  svg.addEventListener('pointermove', move);
  svg.addEventListener('pointerleave', leave);
  return () => {
    svg.removeEventListener('pointermove', move);
    svg.removeEventListener('pointerleave', leave);
  };
}
