export * from './complex';
export * from './rational';
export * from './integer-poly';
export * from './poly';
export * from './rational-function';
export * from './roots';
export * from './routh-hurwitz';
export * from './compensated-horner';
