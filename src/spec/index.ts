/** The design file and the whole chain: schema, validation, designFilter, frequencyResponse. */
export { designSpecSchema, designSpecJsonSchema, REALIZATION_METHODS as SPEC_REALIZATION_METHODS, DECISION_RULES, HALF_POWER_DB, MAX_NAME_LENGTH, DEFAULT_OPAMP, type DesignSpecInput, type ParsedSpec, type OpampSpec } from './schema';
export { parseSpec, sanitiseIdentifier, defaultRippleDb, FORBIDDEN_KEYS, MAX_DEPTH, MAX_NODES, type DesignSpec } from './parse-spec';
export { SpecError, formatIssue, type SpecIssue } from './spec-error';
export { damerauLevenshtein, suggestKey } from './suggest';
export { renderDesignSpecJsonSchema, designSpecSchemaDocument, SCHEMA_ID } from './json-schema';
export { designFilter, prototypeOmega, type FilterDesign, type DesignDiagnostic, type DiagnosticSeverity } from './design-filter';
export { frequencyResponse, MAX_RESPONSE_POINTS, type FrequencyResponse } from './frequency-response';
export { circuitStability, UnstableCircuitError, type CircuitStability } from './stability';
export { evaluateResponse, minimumGainBandwidthHz, type ResponseEvaluation, type ErrorSplit, type GainBandwidthReport, type SwingReport } from './evaluation';
export { evaluationGrid, type EvaluationGrid } from './evaluation-grid';
export { precompensate, type PrecompensationReport } from './precompensation';
export { toCHeader, toSpiceNetlist, toResponseCsv, headerModelOf, designPlots, maskBands, designHashOf, chosenTransferFunction, idealOpampCircuit, type CHeaderOptions, type HeaderExtras, type SpiceNetlistOptions, type PlotExtras } from './outputs';
export { toJsonReport, reportOf, REPORT_SCHEMA_VERSION } from './report';
export { planDesignProduction, checkMeasurements, designMask, designTolerances, trimTargetsOf, planOf, type DesignProduction } from './production';
export { productionOutputs, NO_LOWER_LIMIT_DB, NO_UPPER_LIMIT_DB, type ProductionOutputs } from './production-outputs';
