/**
 * gicladder: the public API. One barrel; every name here is part of the package's contract
 * (see DESIGN.md). Stage folders are listed in pipeline order.
 */
export * from './errors';
export * from './version';
export * from './algebra/index';
export * from './units/index';
export * from './netlist/index';
export * from './analysis/index';
export * from './approximation/index';
export * from './ladder/index';
export * from './transform/index';
export * from './converter/index';
export * from './substitution/index';
export * from './tolerance/index';
export {
  // checkMeasurements(design, csv) of the contract is the spec stage's; the plan-level one is renamed here.
  checkMeasurements as checkPlanMeasurements,
} from './production/check';
export * from './production/index';
export * from './selection/index';
export * from './spec/index';
export * from './export/index';
// The contract's checkMeasurements(design, csvText) is the spec stage's (it also takes a plan).
export { checkMeasurements } from './spec/index';
