/**
 * CSV tables for spreadsheets and test scripts: a header row, one row per frequency, numbers in the
 * shortest form that round-trips (JavaScript's own), '.' as the decimal point, ',' between fields, LF
 * line ends. Column names carry their units. Non-finite values are refused (a CSV cell of NaN would be
 * read back as text by most tools).
 */
import { InvalidInputError } from '../errors';

export interface CsvColumn {
  /** The header cell, e.g. 'gain_db'; letters, digits, '_', '.', '%' and '-' only. */
  readonly name: string;
  readonly values: ArrayLike<number>;
}

const HEADER_CELL = /^[A-Za-z0-9_.%-]+$/;

/** A CSV table of equal-length numeric columns. */
export function renderCsv(columns: readonly CsvColumn[]): string {
  if (columns.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', 'columns', columns, 'must have at least one column');
  const n = columns[0].values.length;
  columns.forEach((c, i) => {
    if (!HEADER_CELL.test(c.name)) throw new InvalidInputError('INVALID_ARGUMENT', `columns[${i}].name`, c.name, 'must be letters, digits, _ . % -');
    if (c.values.length !== n) throw new InvalidInputError('INVALID_ARGUMENT', `columns[${i}].values`, c.values.length, `must have ${n} values like the first column`);
  });
  const lines = [columns.map((c) => c.name).join(',')];
  for (let r = 0; r < n; r++) {
    const cells: string[] = [];
    for (let c = 0; c < columns.length; c++) {
      const v = columns[c].values[r];
      if (!Number.isFinite(v)) throw new InvalidInputError('INVALID_NUMBER', `columns[${c}].values[${r}]`, v, 'must be finite');
      cells.push(String(Object.is(v, -0) ? 0 : v));
    }
    lines.push(cells.join(','));
  }
  return `${lines.join('\n')}\n`;
}
