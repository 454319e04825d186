// CSV exports (ticket times, sales) that are safe to open in a spreadsheet.
//
// OWASP "CSV Injection": a cell must not begin with =, +, -, @, tab, CR or LF unless neutralised,
// because a spreadsheet may run it as a formula. Neutralising = prefix a single quote ('), then
// quote the field and double any quotes inside it. The prefix is done here; quoting and doubling
// are left to the CSV writer (papaparse, every field quoted, CRLF line ends as RFC 4180 says).
//
// Decision on numbers: values that are JavaScript numbers (typeof 'number') come from our own
// data and are written as they are, negative ones too: "-4.5" is a number to a spreadsheet, not a
// formula, and a quote in front would turn it into text and break sums. Non-finite numbers
// (NaN, ±Infinity) are written as empty cells ("-Infinity" would read as a formula). Strings are
// always neutralised, even when they look like numbers ("-1+2" typed into a note stays text).
// Papa's own `escapeFormulae` is not used: its pattern /^[=+\-@\t\r].*$/ has no LF and, without
// the s flag, misses a formula cell that spans lines.
import Papa from 'papaparse';

/** Leading characters OWASP lists as risky: = + - @ tab CR LF. */
const RISKY_START = /^[=+\-@\t\r\n]/;

/** The text of one cell, with a leading ' when it could start a formula. null/undefined → ''. */
export function neutraliseCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = value instanceof Date ? value.toISOString() : String(value);
  return RISKY_START.test(text) ? `'${text}` : text;
}

export interface CsvColumn {
  key: string;
  header: string;
}

/** One cell as handed to the writer: finite numbers stay numbers, everything else neutralised text. */
function cellFor(value: unknown): string | number {
  return typeof value === 'number' && Number.isFinite(value) ? value : neutraliseCell(value);
}

/** A whole CSV document: a header row, then one row per record, every field quoted, CRLF line ends. */
export function toCsv(columns: CsvColumn[], rows: Record<string, unknown>[]): string {
  const fields = columns.map((c) => neutraliseCell(c.header));
  const data = rows.map((row) => columns.map((c) => cellFor(row[c.key])));
  return Papa.unparse({ fields, data }, { quotes: true, newline: '\r\n' });
}
