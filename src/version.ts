/** The library version, stamped into every generated file. test/package.test.ts checks it equals package.json's. */
export const VERSION = '0.1.0';
export const GENERATOR = `gicladder ${VERSION}`;
