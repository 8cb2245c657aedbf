// Colours of the SVG per theme; `currentColor` lets a host page or panel supply the ink.

export type WaveTheme = 'light' | 'dark' | 'currentColor';

export interface Palette {
  background?: string;
  ink: string;
  grid: string;
  gridOpacity: number;
  level: string;
  traces: readonly string[];
}

const palettes: Record<WaveTheme, Palette> = {
  light: {
    background: '#ffffff', ink: '#1f2328', grid: '#d0d7de', gridOpacity: 1, level: '#57606a',
    traces: ['#0a66c2', '#c2410c', '#15803d', '#7e22ce'],
  },
  dark: {
    background: '#1e1e1e', ink: '#e6e6e6', grid: '#3d4349', gridOpacity: 1, level: '#a0a8b0',
    traces: ['#4fa3ff', '#ff9e57', '#4ade80', '#c084fc'],
  },
  // Mid-tone trace colours stay readable on light and dark backgrounds alike.
  currentColor: {
    ink: 'currentColor', grid: 'currentColor', gridOpacity: 0.25, level: 'currentColor',
    traces: ['#3b82f6', '#f97316', '#22c55e', '#a855f7'],
  },
};

export function paletteOf(theme: WaveTheme | undefined): Palette {
  return palettes[theme ?? 'light'] ?? palettes.light;
}
