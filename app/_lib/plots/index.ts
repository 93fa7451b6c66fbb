/**
 * Emberline's plots on the server: the isomorphic builders of app/_plots (plain SI data in,
 * Observable Plot options out), the adapters from fitting results to their inputs, and
 * `plotToSvg` (plot-svg.ts) for the SVG of studies, share links, exports and the first paint.
 */
export * from '@/app/_plots';
export { fitCurveInputFromFits, heatInputFromFit, residualInputFromFit, type FitCurveFromFitsOptions, type HeatFromFitOptions } from './adapters';
