export * from './spice';
export * from './sos';
export * from './bilinear';
export * from './c-literals';
export * from './fixed-point';
export * from './design-hash';
export * from './c-header';
