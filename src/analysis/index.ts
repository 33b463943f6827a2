export * from './mna-system';
export * from './exact-solve';
export * from './transfer-function';
export * from './sparse-lu';
export * from './ac-engine';
export * from './factored-response';
export * from './reduce-rational';
export * from './lu-codegen';
