import { describe, expect, it } from 'vitest';
import { lowpassPrototype } from '../../src/approximation/index';
import { synthesizeLadder } from '../../src/ladder/darlington';
import { elementValues } from './helpers';

/**
 * Classical g-values, from memory: G. L. Matthaei, L. Young, E. M. T. Jones, "Microwave Filters,
 * Impedance-Matching Networks, and Coupling Structures", 1964, sec. 4.05 (Butterworth Eq. 4.05-1,
 * Chebyshev Eq. 4.05-2). g_1..g_n alternate L and C from the source whichever form starts; g_(n+1) is
 * the load resistance when g_n is a shunt C, the load conductance when g_n is a series L.
 */
function butterworthG(n: number): number[] {
  return Array.from({ length: n }, (_, k) => 2 * Math.sin(((2 * (k + 1) - 1) * Math.PI) / (2 * n)));
}

function chebyshevG(n: number, rippleDb: number): { g: number[]; last: number } {
  const beta = Math.log(1 / Math.tanh(rippleDb / 17.37177927613007)); // 40 log10(e) = 17.37...
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k: number): number => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const b = (k: number): number => gamma * gamma + Math.sin((k * Math.PI) / n) ** 2;
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (b(k - 1) * g[k - 2]));
  const last = n % 2 === 1 ? 1 : 1 / Math.tanh(beta / 4) ** 2;
  return { g, last };
}

/** Tolerance by order, the accuracy target: 1e-9 relative to order 11, 1e-6 to 15. */
const tolerance = (n: number): number => (n <= 11 ? 1e-9 : 1e-6);

const maxRelative = (got: number[], want: number[]): number => Math.max(...got.map((g, i) => Math.abs(g / want[i] - 1)));

describe('Butterworth ladders against the closed-form g-values (Matthaei et al. 1964, from memory)', () => {
  for (let n = 1; n <= 15; n++) {
    it.each(['series-first', 'shunt-first'] as const)(`order ${n}, %s`, (form) => {
      const s = synthesizeLadder(lowpassPrototype({ family: 'butterworth', order: n }), { form });
      const got = elementValues(s);
      expect(got.length).toBe(n);
      expect(maxRelative(got, butterworthG(n))).toBeLessThan(tolerance(n));
      expect(s.ladder.branches[0].placement).toBe(form === 'series-first' ? 'series' : 'shunt');
      expect(s.ladder.loadOhms).toBe(1);
    });
  }
});

describe('Chebyshev ladders against the closed-form g-values (Matthaei et al. 1964, from memory)', () => {
  for (const rippleDb of [0.01, 0.5, 2]) {
    for (let n = 1; n <= 15; n++) {
      it.each(['series-first', 'shunt-first'] as const)(`order ${n}, ${rippleDb} dB, %s`, (form) => {
        const s = synthesizeLadder(lowpassPrototype({ family: 'chebyshev', order: n, passbandRippleDb: rippleDb }), { form });
        const { g, last } = chebyshevG(n, rippleDb);
        expect(maxRelative(elementValues(s), g)).toBeLessThan(tolerance(n));
        // Even orders: the computed load. g_n is a shunt C (series-first) -> resistance, else conductance.
        const lastIsShunt = s.ladder.branches[n - 1].placement === 'shunt';
        const load = s.ladder.loadOhms as number;
        expect(Math.abs((lastIsShunt ? load : 1 / load) / last - 1)).toBeLessThan(tolerance(n));
        expect(s.diagnostics.some((d) => d.code === 'LOAD_COMPUTED')).toBe(n % 2 === 0);
      });
    }
  }
});
