import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { toSafeCsv } from '../../../shared/csv/csvSafe';

const cells = (csv: string) =>
  Papa.parse<string[]>(csv, { skipEmptyLines: true })
    .data.slice(1)
    .map((r) => r[0]);

// OWASP, "CSV Injection": cells starting with = + - @, tab or carriage return are prefixed with ' (common practice).
describe('toSafeCsv', () => {
  it.each([
    ['=SUM(A1:A9)', "'=SUM(A1:A9)"],
    ['+1 Roof', "'+1 Roof"],
    ['-2+3', "'-2+3"],
    ['@cmd', "'@cmd"],
    ['\t=1+1', "'\t=1+1"],
    ['\r=1+1', "'\r=1+1"],
    ['=1+2\nsecond line', "'=1+2\nsecond line"], // papaparse's own pattern misses this one
    ['Granary Tower', 'Granary Tower'],
    ['a = b', 'a = b'],
  ])('writes %j so a spreadsheet shows %j as text', (input, shown) => {
    expect(cells(toSafeCsv(['v'], [{ v: input }]))).toEqual([shown]);
  });

  it('leaves numbers, booleans and dates as they are, and writes null as an empty cell', () => {
    const csv = toSafeCsv(['n', 'b', 'd', 'x'], [{ n: -38.4127, b: true, d: new Date('2026-03-01T00:00:00Z'), x: null }]);
    expect(csv).toBe('n,b,d,x\r\n-38.4127,true,2026-03-01T00:00:00.000Z,');
  });

  it('quotes commas, quotes and line breaks (RFC 4180 §2) and keeps only the listed columns, in order', () => {
    const csv = toSafeCsv(['b', 'a'], [{ a: 'say "hi", then go', b: 'two\nlines', secret: 'psk' }]);
    expect(csv).toBe('b,a\r\n"two\nlines","say ""hi"", then go"');
    expect(csv).not.toContain('psk');
  });
});
