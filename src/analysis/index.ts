export * from './mna-system';
export * from './exact-solve';
export * from './transfer-function';
