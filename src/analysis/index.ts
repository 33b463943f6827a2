/**
 * The analysis stage's public API: the MNA description, exact network functions, the compiled float
 * AC engine and the factored float form of an exact H(s). The kernels behind them (sparse-lu.ts,
 * lu-codegen.ts, int-poly.ts, reduce-rational.ts) are internal.
 */
export * from './mna-system';
export * from './exact-solve';
export * from './transfer-function';
export * from './ac-engine';
export * from './factored-response';
