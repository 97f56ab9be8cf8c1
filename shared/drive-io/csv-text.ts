/**
 * A small RFC 4180 reader and writer for the Drive library's component table. The format is
 * narrow (one header row, short text and number cells), so a parser of our own keeps the
 * dependency list short: comma separator, fields optionally wrapped in double quotes, `""` for a
 * quote inside a quoted field, CRLF or LF line ends, a leading UTF-8 byte-order mark ignored.
 */

/** One parsed record with the 1-based physical line it starts on (for error messages). */
export interface CsvRecord {
  line: number;
  fields: string[];
}

/** A structural problem in the CSV text itself (an unterminated quote, text after a quote). */
export interface CsvSyntaxProblem {
  line: number;
  message: string;
}

/** The records of a CSV text, blank lines skipped, plus any syntax problems found. */
export interface CsvParseResult {
  records: CsvRecord[];
  problems: CsvSyntaxProblem[];
}

/**
 * Splits CSV text into records. Never throws: a malformed record is reported in `problems`
 * with its line number and left out of `records`, and parsing resumes at the next line.
 * Lines holding nothing (or only spaces) are skipped.
 */
export function parseCsvText(text: string): CsvParseResult {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  const problems: CsvSyntaxProblem[] = [];
  let i = 0;
  let line = 1;
  const n = src.length;
  while (i < n) {
    const startLine = line;
    const fields: string[] = [];
    let field = '';
    let bad: string | null = null;
    let endOfRecord = false;
    let quotedField = false;
    while (i < n && !endOfRecord) {
      const ch = src[i];
      if (ch === '"' && field.trim() === '' && !quotedField) {
        // Quoted field: read to the closing quote; "" is an escaped quote.
        quotedField = true;
        field = '';
        i += 1;
        let closed = false;
        while (i < n) {
          const c = src[i];
          if (c === '"') {
            if (src[i + 1] === '"') { field += '"'; i += 2; continue; }
            i += 1;
            closed = true;
            break;
          }
          if (c === '\n') line += 1;
          field += c;
          i += 1;
        }
        if (!closed) { bad = 'a quoted field is not closed (a " is missing)'; break; }
        // Only spaces may follow the closing quote before the separator.
        while (i < n && src[i] === ' ') i += 1;
        if (i < n && src[i] !== ',' && src[i] !== '\n' && src[i] !== '\r') {
          bad = 'text follows a closing quote; wrap the whole field in quotes and double any " inside';
          while (i < n && src[i] !== '\n') i += 1;
        }
        continue;
      }
      if (ch === ',') { fields.push(unescapeFormula(quotedField ? field : field.trim())); field = ''; quotedField = false; i += 1; continue; }
      if (ch === '\r' && src[i + 1] === '\n') { i += 1; continue; }
      if (ch === '\n' || ch === '\r') { i += 1; line += 1; endOfRecord = true; continue; }
      if (ch === '"' && !quotedField) {
        bad = 'a " appears inside an unquoted field; wrap the field in quotes and double the "';
        while (i < n && src[i] !== '\n') i += 1;
        continue;
      }
      field += ch;
      i += 1;
    }
    fields.push(unescapeFormula(quotedField ? field : field.trim()));
    if (bad) {
      problems.push({ line: startLine, message: bad });
      continue;
    }
    const blank = fields.length === 1 && fields[0] === '' && !quotedField;
    if (!blank) records.push({ line: startLine, fields });
  }
  return { records, problems };
}

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Quotes a field when it holds a separator, a quote, a line break or edge spaces. A text cell
 * that starts with =, +, -, @, a tab or a carriage return gets a leading apostrophe, so that a
 * spreadsheet shows it as text instead of running it as a formula (OWASP "CSV injection");
 * `parseCsvText` removes that apostrophe again. Plain numbers (-3.5) are left alone.
 */
export function formatCsvField(value: string): string {
  const safe = FORMULA_START.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
  if (/[",\r\n\t]/.test(safe) || safe !== safe.trim()) return `"${safe.replace(/"/g, '""')}"`;
  return safe;
}

/** Undoes `formatCsvField`'s apostrophe before a formula character. */
function unescapeFormula(field: string): string {
  return field.length > 1 && field[0] === "'" && FORMULA_START.test(field.slice(1)) ? field.slice(1) : field;
}

/** Writes records as CSV with CRLF line ends (RFC 4180) and a final line end. */
export function formatCsvText(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(formatCsvField).join(',')).join('\r\n') + '\r\n';
}
