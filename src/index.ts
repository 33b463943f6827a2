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
export * from './selection/index';
export * from './spec/index';
export * from './export/index';
