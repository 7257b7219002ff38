/**
 * A small RFC 4180 CSV reader (comma separator, double-quote quoting, quotes doubled inside
 * quoted fields, CRLF or LF line ends); the writer is ../csv/csv-writer.ts. Hand-written to keep the domain free
 * of dependencies; each record carries the line number where it starts, for error messages.
 */

import { restoreFormulaText } from '../csv/csv-writer';

export interface CsvRecord {
  /** 1-based line number where the record starts. */
  line: number;
  fields: string[];
}

export type CsvReadResult = { ok: true; records: CsvRecord[] } | { ok: false; errors: { line: number; message: string }[] };

/** Splits CSV text into records. Blank lines are skipped; a leading byte order mark is ignored. */
export function readCsv(text: string): CsvReadResult {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  let line = 1;
  let i = 0;
  const n = src.length;
  while (i < n) {
    const startLine = line;
    const fields: string[] = [];
    let field = '';
    let atFieldStart = true;
    let quoted = false;
    let endOfRecord = false;
    while (i < n && !endOfRecord) {
      const c = src[i]!;
      if (quoted) {
        if (c === '"') {
          if (src[i + 1] === '"') {
            field += '"';
            i += 2;
          } else {
            quoted = false;
            i++;
            const after = src[i];
            if (after !== undefined && after !== ',' && after !== '\n' && after !== '\r') {
              return { ok: false, errors: [{ line, message: 'A closing quote must be followed by a comma or the end of the line. Double a quote inside a quoted field ("").' }] };
            }
          }
        } else {
          if (c === '\n') line++;
          else if (c === '\r' && src[i + 1] !== '\n') line++;
          field += c;
          i++;
        }
        continue;
      }
      if (c === '"' && atFieldStart) {
        quoted = true;
        atFieldStart = false;
        i++;
      } else if (c === ',') {
        fields.push(field);
        field = '';
        atFieldStart = true;
        i++;
      } else if (c === '\r' || c === '\n') {
        i += c === '\r' && src[i + 1] === '\n' ? 2 : 1;
        line++;
        endOfRecord = true;
      } else if (c === '"') {
        return { ok: false, errors: [{ line, message: 'A quote appears inside a field that does not start with a quote. Put the whole field in quotes and double the inner quote ("").' }] };
      } else {
        field += c;
        atFieldStart = false;
        i++;
      }
    }
    if (quoted) return { ok: false, errors: [{ line: startLine, message: 'A quoted field is never closed. Add the closing quote.' }] };
    fields.push(field);
    // Fields our writer neutralised against spreadsheet formulas come back as they were.
    if (!(fields.length === 1 && fields[0] === '')) records.push({ line: startLine, fields: fields.map(restoreFormulaText) });
  }
  return { ok: true, records };
}

// Writing goes through the app's one CSV writer (formula neutralising included).
export { csvField, writeCsv } from '../csv/csv-writer';
