/**
 * Test-wide setup. fast-check runs from one fixed seed so that a CI run is reproducible and a failure
 * can be replayed; set FC_SEED to another integer (or to 'random') to explore other cases locally.
 */
import fc from 'fast-check';

const DEFAULT_SEED = 20261201;
const requested = process.env.FC_SEED;
if (requested !== 'random') {
  const seed = requested === undefined ? DEFAULT_SEED : Number(requested);
  fc.configureGlobal({ seed: Number.isInteger(seed) ? seed : DEFAULT_SEED });
}
