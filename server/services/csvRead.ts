import Papa from 'papaparse';
import { ApiError, Invalid } from '../errors';

export interface CsvTable {
  columns: string[];
  rows: Record<string, string>[];
  /** Row-level parse problems (wrong number of cells, stray quotes), by 1-based row. */
  problems: Map<number, string[]>;
}

/** Reads an uploaded CSV file; a file that is not text, has no header or is too long is refused whole. */
export function readCsv(bytes: Buffer, known: readonly string[], required: readonly string[], maxRows: number): CsvTable {
  if (bytes.includes(0)) throw new ApiError(415, 'unsupported_media_type', 'That file is not a CSV text file. Save the sheet as CSV (UTF-8) and try again.');
  const text = bytes.toString('utf8').replace(/^\uFEFF/, '');
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim() });
  const columns = (parsed.meta.fields ?? []).filter((c) => c !== '');
  const unknown = columns.filter((c) => !known.includes(c));
  if (unknown.length)
    throw Invalid(`The file has columns Parapet does not know: ${unknown.join(', ')}. Use these column names: ${known.join(', ')}.`, [
      { path: 'columns', message: `unknown column ${unknown.map((u) => `"${u}"`).join(', ')}` },
    ]);
  const missing = required.filter((c) => !columns.includes(c));
  if (missing.length)
    throw Invalid(
      `The header row lacks the column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}. The first line must name the columns: ${known.join(', ')}.`,
      [{ path: 'columns', message: `missing column ${missing.map((m) => `"${m}"`).join(', ')}` }],
    );
  if (parsed.data.length === 0)
    throw Invalid('The file has a header but no rows. Add at least one row under the header.', [{ path: 'rows', message: 'rows must not be empty' }]);
  if (parsed.data.length > maxRows)
    throw Invalid(`The file has ${parsed.data.length} rows; at most ${maxRows} are imported at once. Split it into smaller files.`, [
      { path: 'rows', message: `rows must be at most ${maxRows}` },
    ]);
  const problems = new Map<number, string[]>();
  for (const e of parsed.errors) {
    if (e.row === undefined) continue;
    const row = e.row + 1;
    problems.set(row, [...(problems.get(row) ?? []), e.message]);
  }
  const rows = parsed.data.map((r) => Object.fromEntries(columns.map((c) => [c, (r[c] ?? '').trim()])));
  return { columns, rows, problems };
}

/** Cells are text; empty cells are left out, numbers become numbers so the shared schemas judge them. */
export function cellsToInput(row: Record<string, string>, numeric: Set<string>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(row)) {
    if (v === '') continue;
    out[k] = numeric.has(k) && /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(v) ? Number(v) : v;
  }
  return out;
}
