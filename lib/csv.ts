/**
 * CSV as RFC 4180 (§2): records end with CRLF; fields are separated by commas;
 * a field that contains a comma, a double quote, CR or LF is enclosed in double
 * quotes, and a double quote inside it is doubled. Other fields are written
 * as they are.
 */

/** A value a CSV cell can hold; null and undefined become an empty field. */
export type CsvValue = string | number | boolean | null | undefined;

/** One field, quoted when RFC 4180 requires it. */
export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  const s = typeof value === 'string' ? value : String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One record, ended by CRLF. */
export function csvRecord(values: readonly CsvValue[]): string {
  return `${values.map(csvField).join(',')}\r\n`;
}

/** A whole file: the header record, then one record per row (columns in header order). */
export function toCsv<K extends string>(columns: readonly K[], rows: readonly Record<K, CsvValue>[]): string {
  let out = csvRecord(columns);
  for (const row of rows) out += csvRecord(columns.map((c) => row[c]));
  return out;
}
