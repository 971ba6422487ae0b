import type { Tone } from './types';

/**
 * Holdfast's chart colours, by role. Chosen for this project: a deep sea
 * teal for the main series, then hues far apart on the wheel so up to six
 * thrusters stay distinguishable, amber and brick for warning and alarm
 * limits. Lines also differ by dash where colour alone would not do.
 */
export const TONE_COLOUR: Record<Tone, string> = {
  primary: '#1d5b6e',
  secondary: '#7d9a36',
  tertiary: '#c2702e',
  quaternary: '#6a58a8',
  quinary: '#2b9490',
  senary: '#a3496a',
  warning: '#b9821a',
  alarm: '#b0362e',
  muted: '#8a949e',
};

/** The flag window's shading. */
export const BAND_FILL = '#f2dca6';
export const GRID = '#e3e7ea';
export const AXIS_INK = '#5a6672';
