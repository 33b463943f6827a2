export * from './spice';
export { zpkToAnalogSections, zpkToDigitalSections, analogSectionsOfRational, type DigitalSection, type ZpkInput, type AnalogSectionOptions } from './sos';
export { bilinearZpk, prewarpScale, type BilinearOptions, type DigitalZpk } from './bilinear';
export {
  formatCFloat,
  formatCInteger,
  cStringLiteral,
  cCommentText,
  sanitiseCIdentifier,
  toCTypeValue,
  type CFloatType,
  type CNumberFormat,
} from './c-literals';
export { quantiseSections, balanceNumerators, type FixedPointFormat, type QuantisedSections } from './fixed-point';
export { fnv1a64, canonicalJson, hashDesign } from './design-hash';
export { renderCHeader, headerIdentifiers, type HeaderModel, type HeaderPart, type HeaderTestPoint, type HeaderTrim, type HeaderDigital } from './c-header';
export {
  PLOT_PALETTE,
  type PlotModel,
  type PlotSeries,
  type PlotBand,
  type PlotMask,
  type PlotMarkers,
  type PlotLevel,
  type PlotRegion,
  type PlotStyle,
  type PlotColor,
} from './svg/plot-model';
export { renderPlotSvg } from './svg/render-svg';
export {
  gainPlot,
  phasePlot,
  groupDelayPlot,
  swingPlot,
  type GainMaskBand,
  type EnvelopeInput,
  type TestLimitInput,
  type GainPlotInput,
  type PhasePlotInput,
  type GroupDelayPlotInput,
  type SwingPlotInput,
} from './svg/plots';
export * from './csv';
