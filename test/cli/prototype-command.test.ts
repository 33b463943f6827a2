import { describe, expect, it } from 'vitest';
import { runPrototypeCommand } from '../../src/cli/prototype-command';

describe('runPrototypeCommand', () => {
  it('prints the Butterworth order-3 ladder as a table (g = 1, 2, 1: Matthaei et al. 1964, from memory)', () => {
    const r = runPrototypeCommand({ family: 'butterworth', order: '3' });
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/1\s+series\s+1\.000000000/);
    expect(r.stdout).toMatch(/2\s+shunt\s+2\.000000000/);
    expect(r.stdout).toContain('poles:');
  });
  it('gives the contract ladder object with --json', () => {
    const r = runPrototypeCommand({ family: 'elliptic', order: 5, rippleDb: '0.5', attenuationDb: '40', form: 'shunt-first', json: true });
    const ladder = JSON.parse(r.stdout);
    expect(ladder.sourceOhms).toBe(1);
    expect(ladder.branches).toHaveLength(5);
    expect(ladder.branches[1]).toMatchObject({ placement: 'series', arrangement: 'parallel' });
  });
  it('exits 2 naming the field on bad input', () => {
    const r = runPrototypeCommand({ family: 'chebyshev', order: '4', rippleDb: 'abc' });
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toContain('--ripple-db');
    expect(runPrototypeCommand({ family: 'nope', order: 3 }).exitCode).toBe(2);
  });
});
