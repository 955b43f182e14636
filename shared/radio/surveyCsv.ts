import Papa from 'papaparse';
import type { Band } from '../enums';

/**
 * Parapet's site-survey CSV: a header row naming the columns, in any order, then one observed network per row.
 *   ssid             optional; empty for a hidden network; at most 32 bytes
 *   channel          required; 1–14 (2.4 GHz) or 32–196 (5 GHz)
 *   channelWidthMHz  optional; 20 (default), 22, 40, 80 or 160
 *   signalDbm        required; −120 to 0
 *   band             optional; 2.4 or 5, else taken from the channel number
 * Example:  ssid,channel,channelWidthMHz,signalDbm
 *           Cafe Guest,6,20,-71
 */
export interface SurveyRow {
  ssid: string;
  band: Band;
  channel: number;
  channelWidthMHz: number;
  signalDbm: number;
}
export interface SurveyParseResult {
  rows: SurveyRow[];
  errors: { line: number; message: string }[];
}

export const SURVEY_MAX_BYTES = 1_000_000;
export const SURVEY_MAX_ROWS = 10_000;
const WIDTHS = [20, 22, 40, 80, 160];
const KNOWN = ['ssid', 'channel', 'channelwidthmhz', 'signaldbm', 'band'];

function parseRow(cells: Record<string, string>): SurveyRow | string {
  const ssid = cells.ssid ?? '';
  if (new TextEncoder().encode(ssid).length > 32) return 'ssid must be at most 32 bytes';
  const channelText = (cells.channel ?? '').trim();
  if (!/^\d{1,3}$/.test(channelText)) return `channel "${channelText}" must be a whole number`;
  const channel = Number(channelText);
  const bandText = cells.band?.trim();
  if (bandText && bandText !== '2.4' && bandText !== '5') return `band "${bandText}" must be 2.4 or 5`;
  const band: Band = bandText ? (bandText as Band) : channel <= 14 ? '2.4' : '5';
  if (band === '2.4' ? channel < 1 || channel > 14 : channel < 32 || channel > 196) {
    return `channel ${channel} is not a ${bandText ? `${band} GHz` : 'Wi-Fi'} channel (2.4 GHz: 1–14, 5 GHz: 32–196)`;
  }
  const widthText = cells.channelwidthmhz?.trim() || '20';
  const channelWidthMHz = Number(widthText);
  if (!WIDTHS.includes(channelWidthMHz)) return `channelWidthMHz "${widthText}" must be one of ${WIDTHS.join(', ')}`;
  const signalText = cells.signaldbm?.trim() ?? '';
  const signalDbm = Number(signalText);
  if (signalText === '' || !Number.isFinite(signalDbm)) return `signalDbm "${signalText}" must be a number`;
  if (signalDbm < -120 || signalDbm > 0) return `signalDbm ${signalDbm} must be between -120 and 0`;
  return { ssid, band, channel, channelWidthMHz, signalDbm };
}

/** Parse a survey row by row: good rows are kept, each bad one is reported with its line number. */
export function parseSurveyCsv(text: string): SurveyParseResult {
  const rows: SurveyRow[] = [];
  const errors: SurveyParseResult['errors'] = [];
  if (new TextEncoder().encode(text).length > SURVEY_MAX_BYTES) {
    return { rows, errors: [{ line: 0, message: `The file is larger than ${SURVEY_MAX_BYTES / 1e6} MB; split it into smaller surveys.` }] };
  }
  const normalised = text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  let header: string[] | null = null;
  let rowStart = 0;
  let line = 1;
  let dataRows = 0;
  Papa.parse<string[]>(normalised, {
    newline: '\n',
    delimiter: ',',
    step(result, parser) {
      const thisLine = line;
      const end = result.meta.cursor;
      line += (normalised.slice(rowStart, end).match(/\n/g) ?? []).length;
      rowStart = end;
      const cells = result.data;
      if (cells.length === 1 && cells[0].trim() === '') return;
      if (result.errors.length > 0) {
        errors.push({ line: thisLine, message: `could not read the row: ${result.errors[0].message}` });
        return;
      }
      if (!header) {
        header = cells.map((c) => c.trim().toLowerCase());
        const missing = ['channel', 'signaldbm'].filter((c) => !header!.includes(c));
        const unknown = header.filter((c) => !KNOWN.includes(c));
        if (missing.length > 0 || unknown.length > 0) {
          errors.push({
            line: thisLine,
            message: `the header must name ssid, channel, channelWidthMHz, signalDbm (band optional); ${missing.length ? `missing ${missing.join(', ')}` : `unknown ${unknown.join(', ')}`}`,
          });
          parser.abort();
        }
        return;
      }
      if (++dataRows > SURVEY_MAX_ROWS) {
        errors.push({ line: thisLine, message: `more than ${SURVEY_MAX_ROWS} rows; the rest was not read` });
        parser.abort();
        return;
      }
      if (cells.length !== header.length) {
        errors.push({ line: thisLine, message: `expected ${header.length} fields, found ${cells.length}` });
        return;
      }
      const byName = Object.fromEntries(header.map((h, i) => [h, cells[i]]));
      const parsed = parseRow(byName);
      if (typeof parsed === 'string') errors.push({ line: thisLine, message: parsed });
      else rows.push(parsed);
    },
  });
  if (!header) errors.push({ line: 1, message: 'the file is empty; it needs a header row ssid,channel,channelWidthMHz,signalDbm' });
  return { rows, errors };
}
