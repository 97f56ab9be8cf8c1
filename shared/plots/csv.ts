/**
 * CSV text for a chart's "Download data": a header row and one row per point, comma-separated with
 * a decimal point (RFC 4180 quoting for text cells), so a spreadsheet opens it as numbers.
 */
export function toCsv(headers: readonly string[], rows: readonly (readonly (number | string | null | undefined)[])[]): string {
  const cell = (v: number | string | null | undefined): string => {
    if (v === null || v === undefined) return '';
    if (typeof v === 'number') return Number.isFinite(v) ? String(Number(v.toPrecision(7))) : '';
    return /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
  };
  const lines = [headers.map(cell).join(',')];
  for (const r of rows) lines.push(r.map(cell).join(','));
  return `${lines.join('\r\n')}\r\n`;
}

/** A file-name-safe slug for downloads, e.g. "RO 4411 · idle" → "ro-4411-idle". */
export function fileSlug(text: string): string {
  return text.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'chart';
}
