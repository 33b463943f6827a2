export * from './spice';
