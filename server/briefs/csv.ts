/**
 * CSV that opens cleanly in a spreadsheet: UTF-8 with a byte-order mark, CRLF line ends, every
 * field quoted when it holds a comma, quote or line break, and a guard against formula
 * injection (a cell starting with = + - @, or a tab or carriage return, gets a leading
 * apostrophe, so a spreadsheet shows it as text; OWASP "CSV Injection" — from memory).
 */
export type CsvCell = string | number | boolean | null | undefined;

export function csvCell(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  let s = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  const lines = [header, ...rows].map((r) => r.map(csvCell).join(','));
  return '\uFEFF' + lines.join('\r\n') + '\r\n';
}
