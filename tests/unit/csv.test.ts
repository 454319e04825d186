import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { neutraliseCell, toCsv } from '@/domain/csv';

// OWASP "CSV Injection" (check-values.md, "Security"): a cell must not begin with =, +, -, @,
// tab, CR or LF unless neutralised — prefix ' and quote the field, doubling quotes.

const RISKY = ['=', '+', '-', '@', '\t', '\r', '\n'];

describe('neutraliseCell', () => {
  it.each([
    ['=', '=HYPERLINK("http://x.example","open")'],
    ['+', '+1+2'],
    ['-', '-2+3'],
    ['@', '@SUM(A1:A2)'],
    ['tab', '\t=1+1'],
    ['CR', '\r=1+1'],
    ['LF', '\n=1+1'],
  ])('prefixes a single quote to a string starting with %s', (_name, text) => {
    expect(neutraliseCell(text)).toBe(`'${text}`);
  });

  it('leaves ordinary text alone, including risky characters later in the text', () => {
    for (const text of ['Oat flat white', 'Sam', 'a=b', 'x-1', 'me@example.com', 'Say "hi"', "O'Brien", '', ' =1']) {
      expect(neutraliseCell(text)).toBe(text);
    }
  });

  it('neutralises strings that look like negative numbers (a typed note is text, not data)', () => {
    expect(neutraliseCell('-4.5')).toBe("'-4.5");
  });

  it('writes finite numbers as they are, negative ones too', () => {
    expect(neutraliseCell(-4.5)).toBe('-4.5');
    expect(neutraliseCell(0)).toBe('0');
    expect(neutraliseCell(1250)).toBe('1250');
  });

  it('writes non-finite numbers, null and undefined as empty cells', () => {
    expect(neutraliseCell(-Infinity)).toBe('');
    expect(neutraliseCell(NaN)).toBe('');
    expect(neutraliseCell(null)).toBe('');
    expect(neutraliseCell(undefined)).toBe('');
  });

  it('writes booleans and dates as text', () => {
    expect(neutraliseCell(true)).toBe('true');
    expect(neutraliseCell(new Date(Date.UTC(2025, 0, 2, 3, 4, 5)))).toBe('2025-01-02T03:04:05.000Z');
  });

  it('never leaves a string cell starting with a risky character', () => {
    fc.assert(
      fc.property(fc.string(), (text) => {
        const out = neutraliseCell(text);
        expect(RISKY.includes(out.charAt(0))).toBe(false);
        // Only ever a one-character prefix, nothing else changes.
        expect(out === text || out === `'${text}`).toBe(true);
      }),
    );
  });
});

describe('toCsv', () => {
  const columns = [
    { key: 'name', header: 'Name' },
    { key: 'note', header: 'Note' },
    { key: 'cents', header: 'Amount (cents)' },
  ];

  it('quotes every field, doubles quotes inside a cell and ends lines with CRLF (RFC 4180)', () => {
    const csv = toCsv(columns, [
      { name: 'Sam', note: 'Say "extra hot"', cents: 450 },
      { name: 'Ana', note: 'oat', cents: 525 },
    ]);
    expect(csv).toBe('"Name","Note","Amount (cents)"\r\n' + '"Sam","Say ""extra hot""","450"\r\n' + '"Ana","oat","525"');
  });

  it('neutralises risky strings, a quote in a neutralised cell is doubled too', () => {
    const csv = toCsv(columns, [{ name: '=HYPERLINK("http://x.example")', note: '@cmd', cents: 1 }]);
    expect(csv.split('\r\n')[1]).toBe(`"'=HYPERLINK(""http://x.example"")","'@cmd","1"`);
  });

  it('keeps negative numbers as numbers but neutralises a negative-looking string', () => {
    const csv = toCsv(columns, [{ name: 'Refund', note: '-5', cents: -450 }]);
    expect(csv.split('\r\n')[1]).toBe(`"Refund","'-5","-450"`);
  });

  it('writes missing values as empty cells and follows the column order', () => {
    const csv = toCsv(columns, [{ cents: 3, name: 'Lee' }]);
    expect(csv.split('\r\n')[1]).toBe('"Lee","","3"');
  });

  it('writes a commas-and-newlines cell inside one quoted field', () => {
    const csv = toCsv([{ key: 'note', header: 'Note' }], [{ note: 'no foam,\r\nextra shot' }]);
    expect(csv).toBe('"Note"\r\n"no foam,\r\nextra shot"');
  });

  it('round-trips through Papa.parse to the neutralised values', () => {
    const cell = fc.oneof(fc.string(), fc.integer({ min: -1e6, max: 1e6 }), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.constant(null));
    const rows = fc.array(fc.record({ name: cell, note: cell, cents: cell }), { minLength: 1, maxLength: 10 });
    fc.assert(
      fc.property(rows, (data) => {
        const parsed = Papa.parse<string[]>(toCsv(columns, data), { newline: '\r\n' });
        expect(parsed.errors).toEqual([]);
        expect(parsed.data).toEqual([columns.map((c) => c.header), ...data.map((row) => columns.map((c) => neutraliseCell(row[c.key as keyof typeof row])))]);
      }),
      { numRuns: 300 },
    );
  });
});
