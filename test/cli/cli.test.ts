import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';

async function run(args: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

describe('gicladder prototype', () => {
  it('prints the 5th-order 0.1 dB Chebyshev ladder with the classical g-values 1.1468, 1.3712, 1.9750 (Matthaei, Young and Jones 1964, table 4.05-2(a), from memory)', async () => {
    const r = await run(['prototype', '--family', 'chebyshev', '--order', '5', '--ripple-db', '0.1']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/1\.1468/);
    expect(r.stdout).toMatch(/1\.3712/);
    expect(r.stdout).toMatch(/1\.9750/);
  });

  it('--json prints the ladder object of the contract', async () => {
    const r = await run(['prototype', '--family', 'butterworth', '--order', '3', '--json']);
    expect(r.code).toBe(0);
    const ladder = JSON.parse(r.stdout);
    expect(ladder.branches).toHaveLength(3);
    expect(ladder.sourceOhms).toBe(1);
    const values = ladder.branches.map((b: { inductanceH?: number; capacitanceF?: number }) => b.inductanceH ?? b.capacitanceF);
    // Butterworth n = 3: g = 1, 2, 1 (g_k = 2 sin((2k - 1) pi / 2n), classical closed form)
    values.forEach((v: number, i: number) => expect(v).toBeCloseTo([1, 2, 1][i], 12));
  });

  it('bad input exits 2 and names the option', async () => {
    const r = await run(['prototype', '--family', 'chebyshev', '--order', 'x']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--order/);
    const missing = await run(['prototype', '--order', '3']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/--family/);
  });

  it('an unknown command exits 2 with the usage', async () => {
    const r = await run(['frobnicate']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/unknown command/);
  });

  it('--help exits 0', async () => {
    const r = await run(['prototype', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Example/);
  });
});
