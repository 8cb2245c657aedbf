// Draws a waveform as SVG elements in the panel: one lane per axis (as the core assigns them), 1-2-5 ticks,
// dashed threshold lines. Colours come from CSS classes bound to the theme's variables (panel.css).
import type { Waveform } from '../core/circuits/model';
import { assignLanes, drawable, type Lane } from '../core/wave/lanes';
import { tickLabel, timeLabel } from '../core/wave/labels';
import { niceTicks } from '../core/wave/ticks';

const svgNs = 'http://www.w3.org/2000/svg';
const margin = { left: 64, right: 92, top: 14, bottom: 54 };
const laneHeight = 170;
const laneGap = 16;

export interface LaneFrame {
  lane: Lane;
  top: number;
  bottom: number;
  toY(value: number): number;
}

/** Where things landed, so the readout can map the mouse back to time and values. */
export interface ChartGeometry {
  svg: SVGSVGElement;
  left: number;
  right: number;
  duration: number;
  frames: LaneFrame[];
  points: number;
}

function element<K extends keyof SVGElementTagNameMap>(name: K, attrs: Record<string, string | number>, parent: Element): SVGElementTagNameMap[K] {
  const node = document.createElementNS(svgNs, name);
  for (const [key, value] of Object.entries(attrs)) node.setAttribute(key, String(value));
  parent.appendChild(node);
  return node;
}

function label(parent: Element, x: number, y: number, content: string, cls: string, anchor = 'start'): void {
  // textContent, never markup: a level or trace label cannot inject anything.
  element('text', { x, y, class: cls, 'text-anchor': anchor }, parent).textContent = content;
}

function polylines(points: ReadonlyArray<[number, number]>, toX: (t: number) => number, toY: (v: number) => number): string[] {
  const runs: string[] = [];
  let run: string[] = [];
  for (const [t, v] of points) {
    if (!drawable(t, v) || !Number.isFinite(t) || !Number.isFinite(v)) {
      if (run.length > 1) runs.push(run.join(' '));
      run = [];
    } else run.push(`${toX(t).toFixed(1)},${toY(v).toFixed(1)}`);
  }
  if (run.length > 1) runs.push(run.join(' '));
  return runs;
}

export function drawChart(host: HTMLElement, wave: Waveform, width: number): ChartGeometry | undefined {
  host.replaceChildren();
  const lanes = assignLanes(wave);
  const duration = wave.duration;
  if (lanes.length === 0 || !(duration > 0 && Number.isFinite(duration))) return undefined;
  const height = margin.top + margin.bottom + lanes.length * laneHeight + (lanes.length - 1) * laneGap;
  const svg = element('svg', { width, height, viewBox: `0 0 ${width} ${height}`, role: 'img', class: 'plot' }, host);
  element('title', {}, svg).textContent = wave.traces.map((t) => t.name).join(' and ') + ' against time';
  const left = margin.left;
  const right = Math.max(left + 40, width - margin.right);
  const toX = (t: number) => left + (Math.min(Math.max(t, 0), duration) / duration) * (right - left);
  const frames = lanes.map((lane, i): LaneFrame => {
    const top = margin.top + i * (laneHeight + laneGap);
    const bottom = top + laneHeight;
    return { lane, top, bottom, toY: (v: number) => bottom - ((v - lane.min) / (lane.max - lane.min)) * (bottom - top) };
  });
  const lastBottom = frames[frames.length - 1].bottom;
  for (const tick of niceTicks(0, duration, Math.max(2, Math.round((right - left) / 90)))) {
    const x = toX(tick);
    for (const frame of frames) element('line', { x1: x, x2: x, y1: frame.top, y2: frame.bottom, class: 'grid' }, svg);
    label(svg, x, lastBottom + 16, timeLabel(tick), 'tick', 'middle');
  }
  let points = 0;
  for (const frame of frames) {
    element('rect', { x: left, y: frame.top, width: right - left, height: frame.bottom - frame.top, class: 'frame' }, svg);
    for (const tick of niceTicks(frame.lane.min, frame.lane.max, Math.max(2, Math.round(laneHeight / 40)))) {
      const y = frame.toY(tick);
      element('line', { x1: left, x2: right, y1: y, y2: y, class: 'grid' }, svg);
      label(svg, left - 6, y + 4, tickLabel(tick, frame.lane.dim), 'tick', 'end');
    }
    if (frame.lane.hasLevels) drawLevels(svg, wave, frame, left, right);
    for (const { trace, index } of frame.lane.traces) {
      for (const run of polylines(trace.points, toX, frame.toY)) element('polyline', { points: run, class: `trace trace-${index % 4}` }, svg);
      points += trace.points.length;
    }
  }
  drawLegend(svg, wave, left, lastBottom + 42);
  return { svg, left, right, duration, frames, points };
}

function drawLevels(svg: SVGSVGElement, wave: Waveform, frame: LaneFrame, left: number, right: number): void {
  const levels = (wave.levels ?? []).filter((l) => Number.isFinite(l.value)).map((l) => ({ ...l, y: frame.toY(l.value) }));
  levels.sort((a, b) => a.y - b.y);
  let lastY = -Infinity;
  for (const level of levels) {
    element('line', { x1: left, x2: right, y1: level.y, y2: level.y, class: 'level' }, svg);
    // Close thresholds keep legible labels: each sits at least a line below the one above.
    const y = Math.max(level.y + 4, lastY + 13);
    lastY = y;
    label(svg, right + 6, y, `${level.label} ${tickLabel(level.value, frame.lane.traces[0]?.trace.dim ?? 'V')}`, 'level-label');
  }
}

function drawLegend(svg: SVGSVGElement, wave: Waveform, x: number, y: number): void {
  wave.traces.forEach((trace, index) => {
    element('line', { x1: x, x2: x + 18, y1: y - 4, y2: y - 4, class: `trace trace-${index % 4}` }, svg);
    label(svg, x + 24, y, trace.name, 'tick');
    x += 24 + 7 * Math.min(trace.name.length, 40) + 20;
  });
}
