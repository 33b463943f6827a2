export * from './mna-system';
export * from './exact-solve';
export * from './transfer-function';
export * from './sparse-lu';
export * from './ac-engine';
