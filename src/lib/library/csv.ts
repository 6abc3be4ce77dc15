/**
 * CSV for the library export. A text cell that starts with = + - @ tab or carriage return gets a
 * leading apostrophe, so a spreadsheet shows it as text instead of running it as a formula
 * (OWASP, "CSV Injection"); a cell holding a comma, quote or line break is quoted, quotes doubled
 * (RFC 4180 §2). Numbers are written as numbers: a number's own text is never a formula.
 */
export type CsvValue = string | number | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]/;

export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_START.test(value) ? `'${value}` : value;
  return NEEDS_QUOTES.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** Rows as CSV text, CRLF line ends (RFC 4180 §2.1). */
export function toCsv(rows: CsvValue[][]): string {
  return rows.map((row) => row.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
