// A waveform as a self-contained SVG: no scripts, fonts or outside references, every text escaped.
import type { Waveform } from '../circuits/model';
import { assignLanes, drawable, MAX_DRAWABLE, type Lane } from './lanes';
import { niceTicks } from './ticks';
import { tickLabel, timeLabel } from './labels';
import { coordinate as c, escapeXml } from './xml';
import { paletteOf, type Palette, type WaveTheme } from './theme';

export { niceTicks } from './ticks';
export { timeLabel, tickLabel } from './labels';

export interface WaveformSvgOptions {
  title: string;
  width?: number;
  height?: number;
  theme?: WaveTheme;
}

const MARGIN = { left: 64, right: 84, top: 44, bottom: 52 };
const LANE_GAP = 18;
const FONT = 'font-family="sans-serif"';

function size(value: number | undefined, fallback: number): number {
  return value !== undefined && Number.isFinite(value) ? Math.min(4000, Math.max(240, Math.round(value))) : fallback;
}

interface Frame {
  left: number;
  right: number;
  top: number;
  bottom: number;
}

function text(x: number, y: number, content: string, attrs: string): string {
  return `<text x="${c(x)}" y="${c(y)}" ${attrs}>${escapeXml(content)}</text>`;
}

/** Polyline point lists, split where a sample is not a finite number. */
function tracePaths(points: ReadonlyArray<[number, number]>, toX: (t: number) => number, toY: (v: number) => number): string[] {
  const runs: string[] = [];
  let run: string[] = [];
  for (const [t, v] of points) {
    if (!drawable(t, v)) {
      if (run.length > 1) runs.push(run.join(' '));
      run = [];
      continue;
    }
    run.push(`${c(toX(t))},${c(toY(v))}`);
  }
  if (run.length > 1) runs.push(run.join(' '));
  return runs;
}

function drawLane(lane: Lane, frame: Frame, wave: Waveform, duration: number, palette: Palette, out: string[]): void {
  const { left, right, top, bottom } = frame;
  const toX = (t: number) => left + (Math.min(Math.max(t, 0), duration) / duration) * (right - left);
  const toY = (v: number) => bottom - ((v - lane.min) / (lane.max - lane.min)) * (bottom - top);
  const grid = `stroke="${palette.grid}" stroke-opacity="${palette.gridOpacity}"`;
  out.push(`<rect x="${c(left)}" y="${c(top)}" width="${c(right - left)}" height="${c(bottom - top)}" fill="none" ${grid}/>`);
  for (const tick of niceTicks(lane.min, lane.max, Math.max(2, Math.round((bottom - top) / 40)))) {
    const y = toY(tick);
    out.push(`<line x1="${c(left)}" y1="${c(y)}" x2="${c(right)}" y2="${c(y)}" ${grid} stroke-width="0.5"/>`);
    out.push(text(left - 6, y + 4, tickLabel(tick, lane.dim), `text-anchor="end" font-size="11" fill="${palette.ink}"`));
  }
  if (lane.hasLevels) drawLevels(wave, toY, frame, palette, out);
  for (const { trace, index } of lane.traces) {
    const colour = palette.traces[index % palette.traces.length];
    for (const points of tracePaths(trace.points, toX, toY)) {
      out.push(`<polyline points="${points}" fill="none" stroke="${colour}" stroke-width="1.6" stroke-linejoin="round"/>`);
    }
  }
}

function levelLabel(wave: Waveform, level: Waveform['levels'][number]): string {
  return `${String(level.label ?? '')} ${tickLabel(level.value, wave.traces[0]?.dim ?? 'V')}`;
}

/** The right margin holds the level labels whole ("end level 2.64 V"): about 6.5 px a character at 11 px, at most a third of the width. */
function rightMargin(wave: Waveform, width: number): number {
  const longest = Math.max(0, ...(wave.levels ?? []).map((level) => Math.min(levelLabel(wave, level).length, 40)));
  return Math.min(Math.max(MARGIN.right, 12 + Math.ceil(6.5 * longest)), Math.floor(width / 3));
}

/** Dashed threshold lines, labelled in the right margin; labels pushed apart so close levels stay legible. */
function drawLevels(wave: Waveform, toY: (v: number) => number, frame: Frame, palette: Palette, out: string[]): void {
  const levels = (wave.levels ?? [])
    .filter((level) => Math.abs(level.value) <= MAX_DRAWABLE)
    .map((level) => ({ ...level, y: toY(level.value) }))
    .sort((a, b) => a.y - b.y);
  let lastLabelY = -Infinity;
  for (const level of levels) {
    out.push(
      `<line x1="${c(frame.left)}" y1="${c(level.y)}" x2="${c(frame.right)}" y2="${c(level.y)}" stroke="${palette.level}" stroke-dasharray="5 4" stroke-width="1"/>`,
    );
    const labelY = Math.max(level.y + 4, lastLabelY + 12);
    lastLabelY = labelY;
    out.push(text(frame.right + 6, labelY, levelLabel(wave, level), `font-size="11" fill="${palette.ink}"`));
  }
}

/** Vertical grid in every lane, labels under the last; drawn before the traces so they sit on top. */
function drawTimeAxis(frames: Frame[], duration: number, palette: Palette, out: string[]): void {
  const grid = `stroke="${palette.grid}" stroke-opacity="${palette.gridOpacity}"`;
  const { left, right } = frames[0];
  const bottom = frames[frames.length - 1].bottom;
  for (const tick of niceTicks(0, duration, Math.max(2, Math.round((right - left) / 90)))) {
    const x = left + (tick / duration) * (right - left);
    for (const frame of frames) {
      const end = frame === frames[frames.length - 1] ? frame.bottom + 4 : frame.bottom;
      out.push(`<line x1="${c(x)}" y1="${c(frame.top)}" x2="${c(x)}" y2="${c(end)}" ${grid} stroke-width="0.5"/>`);
    }
    out.push(text(x, bottom + 17, timeLabel(tick), `text-anchor="middle" font-size="11" fill="${palette.ink}"`));
  }
}

function drawLegend(wave: Waveform, x: number, y: number, palette: Palette, out: string[]): void {
  wave.traces.forEach((trace, index) => {
    const colour = palette.traces[index % palette.traces.length];
    out.push(`<line x1="${c(x)}" y1="${c(y - 4)}" x2="${c(x + 18)}" y2="${c(y - 4)}" stroke="${colour}" stroke-width="2"/>`);
    const name = String(trace.name ?? '');
    out.push(text(x + 24, y, name, `font-size="12" fill="${palette.ink}"`));
    x += 24 + 7 * Math.min(name.length, 40) + 20;
  });
}

export function renderWaveformSvg(wave: Waveform, options: WaveformSvgOptions): string {
  const width = size(options.width, 720);
  const lanes = Array.isArray(wave?.traces) ? assignLanes(wave) : [];
  const height = size(options.height, 150 + 150 * Math.max(1, lanes.length));
  const palette = paletteOf(options.theme);
  const title = String(options.title ?? '');
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${escapeXml(title)}" ${FONT}>`,
    `<title>${escapeXml(title)}</title>`,
  ];
  if (palette.background) out.push(`<rect width="${width}" height="${height}" fill="${palette.background}"/>`);
  out.push(text(MARGIN.left, 24, title, `font-size="14" font-weight="bold" fill="${palette.ink}"`));
  const duration = wave?.duration;
  if (lanes.length === 0 || !(typeof duration === 'number' && duration >= 1e-15 && duration <= 1e9)) {
    out.push(text(width / 2, height / 2, 'No waveform to draw', `text-anchor="middle" font-size="13" fill="${palette.ink}"`));
    out.push('</svg>');
    return out.join('\n');
  }
  const plotTop = MARGIN.top;
  const plotBottom = height - MARGIN.bottom;
  const laneHeight = Math.max(20, (plotBottom - plotTop - LANE_GAP * (lanes.length - 1)) / lanes.length);
  const right = width - rightMargin(wave, width);
  const frames = lanes.map((_, i): Frame => {
    const top = plotTop + i * (laneHeight + LANE_GAP);
    return { left: MARGIN.left, right, top, bottom: top + laneHeight };
  });
  drawTimeAxis(frames, duration, palette, out);
  lanes.forEach((lane, i) => drawLane(lane, frames[i], wave, duration, palette, out));
  drawLegend(wave, MARGIN.left, height - 12, palette, out);
  out.push('</svg>');
  return out.join('\n');
}
