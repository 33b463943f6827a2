/**
 * The reader of measured boards: one CSV row per board and frequency, line by line, so that files of
 * any length stream (memory does not grow with the number of rows).
 *
 * Format (RFC 4180 fields, one record per line):
 * - A header row is required. Column names are matched case-insensitively after trimming, with spaces
 *   and hyphens read as '_' and a unit in parentheses or brackets read as a suffix
 *   ('Frequency (Hz)' = 'frequency_hz'). Accepted names, by role:
 *     board      board, board_id, boardid, serial, serial_number, sn, dut, unit, id
 *     frequency  frequency_hz, frequency, freq_hz, freq, f_hz, hz
 *     gain       gain_db, gain, magnitude_db, mag_db, level_db, db
 *     phase      phase_deg, phase, phase_degrees, deg           (optional column)
 *   Other columns are ignored. Board, frequency and gain are required.
 * - The separator is taken from the header: ',' unless the header has none and has ';' or a tab.
 * - Lines whose first non-blank character is '#' are comments; blank lines are skipped; a trailing CR
 *   (CRLF files) and a leading byte-order mark are removed.
 * - Fields may be double-quoted ("" is a quote inside); a quoted field cannot span lines.
 * - Numbers are plain decimals ('1000', '1e3', '-0.25'); frequency must be > 0; gain and phase finite.
 *   An empty phase cell means "not measured" for that row.
 * Every problem is a {@link CsvError} (code 'INVALID_CSV') with the 1-based line and the column name.
 */
import { InvalidInputError } from '../errors';

/** A CSV problem: the line (1-based) and the column (header name, or a number when there is none). */
export class CsvError extends InvalidInputError {
  readonly line: number;
  readonly column: string;
  constructor(line: number, column: string, value: unknown, message: string) {
    super('INVALID_CSV', `csv line ${line}${column ? `, column ${column}` : ''}`, value, message);
    this.line = line;
    this.column = column;
  }
}

export interface MeasurementRow {
  readonly board: string;
  readonly frequencyHz: number;
  readonly gainDb: number;
  /** Absent when the file has no phase column or the cell is empty. */
  readonly phaseDeg?: number;
  /** 1-based line of the row in the input. */
  readonly line: number;
}

type Role = 'board' | 'frequency' | 'gain' | 'phase';

const NAMES: Readonly<Record<Role, readonly string[]>> = {
  board: ['board', 'board_id', 'boardid', 'serial', 'serial_number', 'sn', 'dut', 'unit', 'id'],
  frequency: ['frequency_hz', 'frequency', 'freq_hz', 'freq', 'f_hz', 'hz'],
  gain: ['gain_db', 'gain', 'magnitude_db', 'mag_db', 'level_db', 'db'],
  phase: ['phase_deg', 'phase', 'phase_degrees', 'deg'],
};

/** A plain decimal number (no hex, no 'Infinity', no empty string, which Number() would all accept). */
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Normalises a header cell: 'Frequency (Hz)' -> 'frequency_hz'. */
export function normalizeColumnName(name: string): string {
  return name
    .trim()
    .toLowerCase()
    .replace(/[([]\s*([^)\]]*?)\s*[)\]]/g, '_$1')
    .replace(/[\s-]+/g, '_')
    .replace(/_+/g, '_')
    .replace(/^_|_$/g, '');
}

/** Splits one line into fields (RFC 4180 quoting within the line); null when a quote is not closed. */
export function splitCsvLine(line: string, separator: string): string[] | null {
  const out: string[] = [];
  let i = 0;
  const n = line.length;
  for (;;) {
    let field = '';
    // Spaces before an opening quote are allowed (and dropped).
    let j = i;
    while (j < n && (line[j] === ' ' || line[j] === '\t') && line[j] !== separator) j++;
    if (j < n && line[j] === '"') {
      j++;
      for (;;) {
        const q = line.indexOf('"', j);
        if (q < 0) return null;
        field += line.slice(j, q);
        if (line[q + 1] === '"') {
          field += '"';
          j = q + 2;
          continue;
        }
        j = q + 1;
        break;
      }
      while (j < n && line[j] !== separator) j++; // text after the closing quote is ignored if blank
      out.push(field);
    } else {
      const s = line.indexOf(separator, i);
      const end = s < 0 ? n : s;
      out.push(line.slice(i, end));
      j = end;
    }
    if (j >= n) return out;
    i = j + 1;
  }
}

/**
 * An incremental reader: feed lines in order with {@link MeasurementReader.read}; it returns a row, or
 * null for the header, comments and blank lines. Throws CsvError.
 */
export class MeasurementReader {
  private lineNumber = 0;
  private separator = ',';
  private columns: Record<Role, number> | null = null;
  private headerNames: string[] = [];

  /** Lines read so far. */
  get linesRead(): number {
    return this.lineNumber;
  }

  /** True once the header has been read. */
  get hasHeader(): boolean {
    return this.columns !== null;
  }

  /** True when the file has a phase column. */
  get hasPhase(): boolean {
    return this.columns !== null && this.columns.phase >= 0;
  }

  read(rawLine: string): MeasurementRow | null {
    this.lineNumber++;
    let line = rawLine;
    if (this.lineNumber === 1 && line.charCodeAt(0) === 0xfeff) line = line.slice(1);
    if (line.endsWith('\r')) line = line.slice(0, -1);
    const trimmed = line.trim();
    if (trimmed.length === 0 || trimmed.startsWith('#')) return null;
    if (!this.columns) {
      this.readHeader(line);
      return null;
    }
    const cells = splitCsvLine(line, this.separator);
    if (!cells) throw new CsvError(this.lineNumber, '', line, 'has a quoted field that is not closed');
    const c = this.columns;
    const need = Math.max(c.board, c.frequency, c.gain);
    if (cells.length <= need) {
      const missing = ([c.board, c.frequency, c.gain] as const).find((k) => k >= cells.length)!;
      throw new CsvError(this.lineNumber, this.headerNames[missing], line, `has ${cells.length} fields; the header has ${this.headerNames.length}`);
    }
    const board = cells[c.board].trim();
    if (board.length === 0) throw new CsvError(this.lineNumber, this.headerNames[c.board], cells[c.board], 'board id is empty');
    const frequencyHz = this.number(cells[c.frequency], c.frequency);
    if (!(frequencyHz > 0)) throw new CsvError(this.lineNumber, this.headerNames[c.frequency], cells[c.frequency], 'frequency must be greater than zero');
    const gainDb = this.number(cells[c.gain], c.gain);
    let phaseDeg: number | undefined;
    if (c.phase >= 0 && c.phase < cells.length && cells[c.phase].trim().length > 0) phaseDeg = this.number(cells[c.phase], c.phase);
    return phaseDeg === undefined ? { board, frequencyHz, gainDb, line: this.lineNumber } : { board, frequencyHz, gainDb, phaseDeg, line: this.lineNumber };
  }

  private number(cell: string, column: number): number {
    const text = cell.trim();
    const v = DECIMAL.test(text) ? Number(text) : NaN;
    if (!Number.isFinite(v)) throw new CsvError(this.lineNumber, this.headerNames[column], cell, 'is not a finite decimal number');
    return v;
  }

  private readHeader(line: string): void {
    this.separator = line.includes(',') ? ',' : line.includes(';') ? ';' : line.includes('\t') ? '\t' : ',';
    const cells = splitCsvLine(line, this.separator);
    if (!cells) throw new CsvError(this.lineNumber, '', line, 'header has a quoted field that is not closed');
    this.headerNames = cells.map((h) => h.trim());
    const columns: Record<Role, number> = { board: -1, frequency: -1, gain: -1, phase: -1 };
    cells.forEach((h, i) => {
      const name = normalizeColumnName(h);
      for (const role of Object.keys(NAMES) as Role[]) {
        if (!NAMES[role].includes(name)) continue;
        if (columns[role] >= 0) throw new CsvError(this.lineNumber, h.trim(), line, `a second ${role} column (the first is '${this.headerNames[columns[role]]}')`);
        columns[role] = i;
      }
    });
    for (const role of ['board', 'frequency', 'gain'] as const) {
      if (columns[role] < 0) {
        throw new CsvError(this.lineNumber, '', line, `the header has no ${role} column (expected one of ${NAMES[role].join(', ')}); a header row is required`);
      }
    }
    this.columns = columns;
  }
}

/** The lines of a text, lazily (LF or CRLF; CR is removed by the reader). */
export function* linesOfText(text: string): Generator<string> {
  let start = 0;
  for (;;) {
    const nl = text.indexOf('\n', start);
    if (nl < 0) {
      if (start < text.length) yield text.slice(start);
      return;
    }
    yield text.slice(start, nl);
    start = nl + 1;
  }
}

/** Re-cuts arbitrary text chunks (a file read in blocks) into lines, holding at most one partial line. */
export async function* linesOfChunks(chunks: AsyncIterable<string> | Iterable<string>): AsyncGenerator<string> {
  let rest = '';
  for await (const chunk of chunks) {
    rest += chunk;
    let nl = rest.indexOf('\n');
    while (nl >= 0) {
      yield rest.slice(0, nl);
      rest = rest.slice(nl + 1);
      nl = rest.indexOf('\n');
    }
  }
  if (rest.length > 0) yield rest;
}
