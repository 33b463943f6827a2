/**
 * gicladder: the public API. One barrel; every name here is part of the package's contract
 * (see DESIGN.md). Stage folders are listed in pipeline order.
 */
export * from './errors';
export * from './algebra/index';
