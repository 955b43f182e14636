import Papa from 'papaparse';

// Spreadsheets run a cell that starts with = + - @ (or a tab or carriage return that hides one) as a
// formula; papaparse prefixes such a cell with a single quote so it shows as text (OWASP, "CSV
// Injection", common practice). Its built-in pattern ends in `.*$`, which a line break inside the
// cell slips past, so the pattern here only looks at the first character.
export const FORMULA_START = /^[=+\-@\t\r]/;

const plain = (value: unknown) => (value === null || value === undefined ? '' : value instanceof Date ? value.toISOString() : value);

/** A CSV document (RFC 4180 quoting) with every text cell neutralised; numbers stay numbers ("-38.4" cannot be a formula). */
export function toSafeCsv(columns: readonly string[], rows: readonly Record<string, unknown>[]): string {
  const data = rows.map((row) => columns.map((c) => plain(row[c])));
  return Papa.unparse({ fields: [...columns], data }, { newline: '\r\n', escapeFormulae: FORMULA_START });
}
