export * from './network';
export * from './response';
export * from './frequency';
export * from './bruton';
