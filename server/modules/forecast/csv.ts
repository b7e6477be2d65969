// CSV for spreadsheets: RFC 4180 quoting, CRLF line ends, and text cells that a spreadsheet would
// read as a formula (=, +, -, @, tab, CR) prefixed with a quote mark so they stay text.
const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: string | number): string {
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_START.test(value) && !/^-?\d+(\.\d+)?$/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(lines: (string | number)[][]): string {
  return lines.map((line) => line.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
