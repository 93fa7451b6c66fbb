/**
 * Emberline's plots as pure functions: plain SI data in, Observable Plot options out, each with a
 * title and a summary for the figcaption. Isomorphic: the server renders the options to SVG
 * (app/_lib/plots/plot-svg.ts, linkedom) for studies, share links, exports and the first paint;
 * client components (the fit and forecast pages) build the same options from the numbers they
 * receive and draw them with Plot.plot. No server-only code, no mathjs: the adapters from fits
 * (which need the fitting engine) are in app/_lib/plots/adapters.ts.
 */
export { COLORS, type PlotFigure } from './theme';
export { fitCurvePlot, TOOLTIP_MAX_TRIALS, type FitCurveInput, type FitCurveTrial, type FitCurveReplicate, type FitCurveModel } from './fit-curve';
export { residualPlots, type ResidualInput, type ResidualPoint, type ResidualFlag, type ResidualFigures } from './residuals';
export { heatPlot, type HeatPlotInput, type HeatCurvePoint } from './heat';
export { forecastPlot, forecastInputFromResult, energyBudgetPlot, energyBudgetInput, type ForecastPlotInput, type EnergyBudgetInput, type EnergyTerm } from './forecast';
export { timeSeriesSegmentsPlot, type TimeSeriesInput, type TimeSeriesFigures, type LogPoint, type LogSegment } from './time-series';
