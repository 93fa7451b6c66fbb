/**
 * Emberline's plot style, from tailwind.config.ts: ember for heat, teal for water and the inlet,
 * ink for text and data points, caution and danger tones for safety lines.
 */
import type * as Plot from '@observablehq/plot';
import type { Caution } from '@/analysis/safety/cautions';

export const COLORS = {
  heat: '#B84E0C', // ember-600
  heatLight: '#F07F35', // ember-400
  heatPale: '#F8A066', // ember-300
  heatDeep: '#6E3110', // ember-800
  water: '#0F6E73', // water-600
  waterLight: '#2C9AA0', // water-400
  ink: '#1F1A17',
  inkSoft: '#4A403A',
  inkMuted: '#6B5E55',
  paper: '#FBF7F1',
  paperDeep: '#F3ECE2',
  paperLine: '#E4D9CB',
  caution: '#7A4B00',
  cautionLine: '#E9C46A',
  danger: '#9B1C13',
  dangerLine: '#E8A29B',
  point: '#241E1B', // coal
} as const;

/** Dash patterns for overlaid model curves, primary first (solid). */
export const DASHES = ['none', '7 4', '2 3', '10 3 2 3', '4 2 4 6'] as const;

/** Stroke colours for overlaid model curves, primary first. */
export const MODEL_STROKES = [COLORS.heat, COLORS.inkSoft, COLORS.heatDeep, COLORS.inkMuted, COLORS.water] as const;

/** The shared frame: size, margins, font and colours. */
export function baseOptions(o: { width?: number; height?: number; ariaLabel: string; ariaDescription: string }): Plot.PlotOptions {
  return {
    width: o.width ?? 640,
    height: o.height ?? 360,
    marginLeft: 56,
    marginRight: 24,
    marginTop: 24,
    marginBottom: 44,
    ariaLabel: o.ariaLabel,
    ariaDescription: o.ariaDescription,
    style: { fontFamily: 'Inter, sans-serif', fontSize: '12px', color: COLORS.inkSoft, background: 'transparent', overflow: 'visible' },
  };
}

/** What every plot function returns: options for Plot.plot / plotToSvg and the words beside them. */
export interface PlotFigure {
  /** short title for a heading and the SVG's aria-label */
  title: string;
  /** one or two sentences for a figcaption (also the SVG's aria-description) */
  summary: string;
  options: Plot.PlotOptions;
  /**
   * the cautions of the temperatures the plot shows (one per hazard and place, from
   * analysis/safety hottestCautions), shown beside it; absent or empty when all are below 40 °C
   */
  cautions?: Caution[];
}
