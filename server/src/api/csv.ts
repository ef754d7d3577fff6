/**
 * Minimal CSV writing (RFC 4180): a field holding a comma, a double quote, CR or LF is enclosed
 * in double quotes with inner quotes doubled; lines end in CRLF. Numbers are written with
 * JavaScript's shortest round-trip form; null and undefined become empty fields.
 */

/** Escapes one field per RFC 4180 section 2. */
export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** One CSV line with its CRLF. */
export function csvLine(fields: readonly (string | number | null | undefined)[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}
