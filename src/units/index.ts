export * from './unit-symbols';
export * from './prefixes';
export * from './parse';
export * from './format';
export * from './eseries';
