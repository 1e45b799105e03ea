import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvField, csvRecord, toCsv } from '@/lib/csv';

describe('CSV serialisation (RFC 4180)', () => {
  it('quotes fields with a comma, quote, CR or LF, doubles quotes, ends records with CRLF', () => {
    // REFERENCES.md §8, RFC 4180 §2 rules 1, 6 and 7 (V): the reference check value.
    expect(csvRecord(['a', 'b"b', 'c,d', 'e\r\nf'])).toBe('a,"b""b","c,d","e\r\nf"\r\n');
  });

  it('writes plain fields as they are and empties for null', () => {
    // RFC 4180 §2 rule 5 (V): quoting is optional, so a field without special characters stays bare.
    expect(csvField('plain text')).toBe('plain text');
    expect(csvField(1.5)).toBe('1.5');
    expect(csvField(false)).toBe('false');
    expect(csvField(null)).toBe('');
    expect(csvField('lone\nLF')).toBe('"lone\nLF"');
    expect(csvField('cr\ronly')).toBe('"cr\ronly"');
  });

  it('parses back with a general-purpose CSV parser into the same rows, whatever the text', () => {
    const cell = fc.string({ unit: fc.constantFrom('a', 'b', ' ', ',', '"', '\r', '\n', 'é', '🪱', ';') , maxLength: 12 });
    fc.assert(
      fc.property(fc.array(fc.tuple(cell, cell, cell), { minLength: 1, maxLength: 8 }), (rows) => {
        const text = toCsv(['x', 'y', 'z'] as const, rows.map(([x, y, z]) => ({ x, y, z })));
        expect(text.endsWith('\r\n')).toBe(true);
        const back = parse(text, { columns: true, record_delimiter: '\r\n', relax_quotes: false }) as Record<string, string>[];
        expect(back).toEqual(rows.map(([x, y, z]) => ({ x, y, z })));
      }),
      { numRuns: 300 },
    );
  });
});
