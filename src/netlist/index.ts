export * from './opamp';
export * from './stamp';
export * from './elements';
export * from './circuit';
export * from './topology';
export * from './errors';
