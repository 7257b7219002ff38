/**
 * The one CSV writer of the app (timeline export, members export): RFC 4180 quoting, CRLF line
 * ends, and spreadsheet formula neutralising. A field that starts with = + - @ tab or carriage
 * return would run as a formula in a spreadsheet (OWASP, "CSV Injection"), so it gets a leading
 * apostrophe, which spreadsheets show as text. Fields that already start with apostrophes before
 * such a character get one more, so `restoreFormulaText` can undo exactly what was added and a
 * timeline survives export and import unchanged. Hand-written (a few lines) so src/lib stays
 * dependency-free and runs in the browser.
 */

const FORMULA_START = /^'*[=+\-@\t\r]/;
const NEUTRALISED = /^'+[=+\-@\t\r]/;

/** A field as written: neutralised, then quoted when it holds a comma, quote, line break or outer spaces. */
export function csvField(value: string | null | undefined): string {
  let v = value ?? '';
  if (FORMULA_START.test(v)) v = `'${v}`;
  return /[",\r\n]|^\s|\s$/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** Records as CSV text with CRLF line ends (RFC 4180 §2). */
export function writeCsv(rows: readonly (readonly (string | null | undefined)[])[]): string {
  return rows.map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/** Undoes `csvField`'s apostrophe on a field read back from our own export. */
export function restoreFormulaText(field: string): string {
  return NEUTRALISED.test(field) ? field.slice(1) : field;
}
