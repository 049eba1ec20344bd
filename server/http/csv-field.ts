/** One CSV field per RFC 4180: quoted when it holds a comma, quote or line break. */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return '';
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV line (CRLF-terminated, RFC 4180 §2). */
export function csvLine(values: unknown[]): string {
  return `${values.map(csvField).join(',')}\r\n`;
}
