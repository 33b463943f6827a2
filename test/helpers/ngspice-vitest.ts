/** vitest glue for the ngspice helper (kept apart so that scripts and benches can use the runner). */
import { describe, it } from 'vitest';
import { ngspiceStatus } from './ngspice';

/**
 * `describe` for tests that need ngspice. Installed: runs them. Missing locally: skips the block, the
 * reason in its name. Missing with CI=true: one failing test, because CI must run the cross-check.
 */
export function describeWithNgspice(name: string, body: () => void): void {
  const status = ngspiceStatus();
  if (status.available) {
    describe(`${name} (reference: ngspice ${status.version})`, body);
  } else if (process.env.CI === 'true') {
    describe(name, () => {
      it('needs ngspice, which CI must install (apt-get install -y ngspice)', () => {
        throw new Error(`ngspice is not installed but CI=true requires the cross-check: ${status.reason}`);
      });
    });
  } else {
    describe.skip(`${name} [SKIPPED: ngspice is not installed (${status.reason}); install it with apt-get install -y ngspice]`, body);
  }
}
