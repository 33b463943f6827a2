import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { renderCsv } from '../../src/export/csv';
import { expectInvalid } from '../helpers/expect-error';

describe('renderCsv', () => {
  it('writes a header and rows whose numbers read back to the same doubles', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true })), { minLength: 1, maxLength: 30 }), (rows) => {
        const text = renderCsv([
          { name: 'frequency_hz', values: rows.map((r) => r[0]) },
          { name: 'gain_db', values: rows.map((r) => r[1]) },
        ]);
        const lines = text.trimEnd().split('\n');
        expect(lines[0]).toBe('frequency_hz,gain_db');
        lines.slice(1).forEach((line, i) => {
          const [a, b] = line.split(',').map(Number);
          expect(a).toBe(rows[i][0] === 0 ? 0 : rows[i][0]);
          expect(b).toBe(rows[i][1] === 0 ? 0 : rows[i][1]);
        });
      }),
    );
  });

  it('refuses NaN, Infinity, ragged columns and header cells that would break the table', () => {
    expectInvalid(() => renderCsv([{ name: 'x', values: [1, NaN] }]), 'INVALID_NUMBER', 'columns[0].values[1]');
    expectInvalid(() => renderCsv([{ name: 'x', values: [Infinity] }]), 'INVALID_NUMBER');
    expectInvalid(() => renderCsv([{ name: 'x', values: [1] }, { name: 'y', values: [1, 2] }]), 'INVALID_ARGUMENT', 'columns[1].values');
    expectInvalid(() => renderCsv([{ name: 'a,b', values: [1] }]), 'INVALID_ARGUMENT', 'columns[0].name');
    expectInvalid(() => renderCsv([]), 'INVALID_ARGUMENT', 'columns');
  });
});
