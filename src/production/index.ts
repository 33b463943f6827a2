/**
 * Production test and firmware trim: test points, guard-banded limits (ILAC-G8 decision rules), global
 * risks (JCGM 106), process capability, measured-data checking, trim tables and trim simulation.
 * Browser-safe: reading files from disk is the CLI's job (feed lines to checkMeasurementsStream).
 */
export * from '../algebra/normal';
export * from './interval';
export * from './statistics';
export * from './quadrature';
export * from './capability';
export * from './decision-rules';
export * from './risk';
export * from './limits';
export * from './test-points';
export * from './boards';
export * from './plan';
export * from './csv';
export * from './check';
export * from './trim';
