import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvField, restoreFormulaText, writeCsv } from '~/lib/csv/csv-writer';
import { readCsv } from '~/lib/timeline/csv-records';
import { membersCsv } from '~/lib/billing/members-csv';

// OWASP "CSV Injection": cells starting with = + - @ tab or carriage return run as formulas in
// spreadsheets; a leading apostrophe makes them text.
describe('the CSV writer', () => {
  it.each([
    ['=HYPERLINK("http://x.example","click")', `"'=HYPERLINK(""http://x.example"",""click"")"`],
    ['+1+1', "'+1+1"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tcmd', "'\tcmd"],
    ['\r=1', `"'\r=1"`],
    ["'=already", "''=already"],
    ['plain text', 'plain text'],
    ['a, b', '"a, b"'],
    ['', ''],
  ])('writes %j as %j', (value, written) => {
    expect(csvField(value)).toBe(written);
  });

  it('reads back exactly what it wrote, whatever the text (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.string({ unit: 'grapheme-composite' }), { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 5 }), (rows) => {
        const nonBlank = rows.filter((r) => !(r.length === 1 && r[0] === ''));
        const read = readCsv(writeCsv(nonBlank));
        expect(read.ok).toBe(true);
        if (read.ok) expect(read.records.map((r) => r.fields)).toEqual(nonBlank);
      }),
    );
    expect(restoreFormulaText("'=1")).toBe('=1');
    expect(restoreFormulaText("'plain")).toBe("'plain"); // only what the writer added is taken off
  });

  it('is the members export’s writer too', () => {
    const csv = membersCsv([{ userId: 'u', name: '=cmd|" /C calc"!A0', email: '@evil.example', status: 'active', since: null, trialEnd: null, promoCode: null }]);
    expect(csv.split('\r\n')[1]).toBe(`"'=cmd|"" /C calc""!A0",'@evil.example,Active,,,`);
  });
});
