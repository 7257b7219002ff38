/**
 * A small RFC 4180 CSV reader and writer (comma separator, double-quote quoting, quotes
 * doubled inside quoted fields, CRLF or LF line ends). Hand-written to keep the domain free
 * of dependencies; each record carries the line number where it starts, for error messages.
 */

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
    if (!(fields.length === 1 && fields[0] === '')) records.push({ line: startLine, fields });
  }
  return { ok: true, records };
}

/** Quotes a field when it holds a comma, quote, line break or outer spaces. */
export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Writes records with CRLF line ends, as RFC 4180 specifies. */
export function writeCsv(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}
