/**
 * Emberline's plots as pure functions: plain SI data in, Observable Plot options out (render them
 * with plotToSvg on the server or Plot.plot in a client component), each with a title and a
 * summary for the figcaption. Adapters turn the analysis results into the plot inputs.
 */
export { COLORS, type PlotFigure } from './theme';
export { fitCurvePlot, fitCurveInputFromFits, type FitCurveInput, type FitCurveTrial, type FitCurveReplicate, type FitCurveModel, type FitCurveFromFitsOptions } from './fit-curve';
export { residualPlots, residualInputFromFit, type ResidualInput, type ResidualPoint, type ResidualFlag, type ResidualFigures } from './residuals';
export { heatPlot, heatInputFromFit, type HeatPlotInput, type HeatCurvePoint, type HeatFromFitOptions } from './heat';
export { forecastPlot, forecastInputFromResult, energyBudgetPlot, energyBudgetInput, type ForecastPlotInput, type EnergyBudgetInput, type EnergyTerm } from './forecast';
export { timeSeriesSegmentsPlot, type TimeSeriesInput, type TimeSeriesFigures, type LogPoint, type LogSegment } from './time-series';
