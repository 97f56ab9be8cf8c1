/**
 * The case report as a PDF (pdfkit 0.20.2 + svg-to-pdfkit 0.1.8): the shop header, the case facts,
 * the confirmed cause, the evidence plot (SVG from report-chart.ts), before/after figures, who
 * confirmed and when, and the safety cautions. Fonts are the shipped @fontsource Inter and
 * JetBrains Mono `.woff` files (pdfkit reads WOFF; its WOFF2 reader fails on some glyphs); each
 * file holds one character subset, so text outside Latin-1 switches to the latin-ext file.
 */
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
import type { ReportContent } from '../../shared/report/report-content';
import { EVIDENCE_SIZE } from './report-chart';

const require = createRequire(import.meta.url);
const font = (pkg: string, file: string) => require.resolve(`@fontsource/${pkg}/files/${file}`);

/** Font files by the names the PDF uses. */
const FONTS = {
  Sans: font('inter', 'inter-latin-400-normal.woff'),
  SansSemi: font('inter', 'inter-latin-600-normal.woff'),
  SansBold: font('inter', 'inter-latin-700-normal.woff'),
  SansExt: font('inter', 'inter-latin-ext-400-normal.woff'),
  SansExtBold: font('inter', 'inter-latin-ext-700-normal.woff'),
  Mono: font('jetbrains-mono', 'jetbrains-mono-latin-400-normal.woff'),
} as const;
type FontName = keyof typeof FONTS;

// The "latin" subset of fontsource: Basic Latin, Latin-1 and the punctuation block (– — ‘ ’ “ ” • …),
// plus a few symbols (€ ™ − ∕). The latin-ext file holds the rest of the Latin letters but not
// ASCII, so mixed text is set run by run.
const LATIN_CHAR = /[\u0000-\u00ff\u0131\u0152\u0153\u02bb\u02bc\u02c6\u02da\u02dc\u2000-\u206f\u20ac\u2122\u2191\u2193\u2212\u2215\ufeff\ufffd]/;

/** Splits text into runs that one font file can set: [text, needs latin-ext]. */
export function fontRuns(text: string): [string, boolean][] {
  const runs: [string, boolean][] = [];
  for (const ch of text) {
    const ext = !LATIN_CHAR.test(ch);
    const last = runs.at(-1);
    if (last && last[1] === ext) last[0] += ch;
    else runs.push([ch, ext]);
  }
  return runs;
}

/** Writes text (at x, y when given) in as many runs as its characters need, continuing one paragraph. */
function write(doc: PDFKit.PDFDocument, t: string, base: FontName, ext: FontName, opts: PDFKit.Mixins.TextOptions, at?: [number, number]): void {
  const runs = fontRuns(t);
  if (runs.length === 0) runs.push(['', false]);
  runs.forEach(([run, isExt], i) => {
    doc.font(isExt ? ext : base);
    const o = { ...opts, continued: i < runs.length - 1 };
    if (i === 0 && at) doc.text(run, at[0], at[1], o);
    else doc.text(run, o);
  });
}

const INK = '#192029';
const MUTED = '#5c646f';
const AMBER = '#5b3106';
const RULE = '#d7dbe0';

/** Renders the report to a PDF buffer. `evidenceSvg` is drawn when given (advisor copy). */
export function renderReportPdf(content: ReportContent, evidenceSvg: string | null): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margin: 40, info: { Title: content.title, Author: content.shop.name, Creator: 'Crankwise' } });
  for (const [name, file] of Object.entries(FONTS)) doc.registerFont(name, file);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const width = doc.page.width - 80;
  const text = (t: string, size: number, opts: { bold?: boolean; color?: string; gap?: number; semi?: boolean } & PDFKit.Mixins.TextOptions = {}) => {
    const { bold = false, color = INK, gap = 4, semi = false, ...rest } = opts;
    doc.fontSize(size).fillColor(color);
    write(doc, t, semi ? 'SansSemi' : bold ? 'SansBold' : 'Sans', bold || semi ? 'SansExtBold' : 'SansExt', { width, ...rest });
    doc.moveDown(gap / size);
  };
  const rule = () => {
    doc.moveDown(0.3);
    doc.strokeColor(RULE).lineWidth(0.8).moveTo(40, doc.y).lineTo(40 + width, doc.y).stroke();
    doc.moveDown(0.6);
  };
  const heading = (t: string) => text(t, 12, { bold: true, gap: 6 });
  const ensure = (h: number) => {
    if (doc.y + h > doc.page.height - 60) doc.addPage();
  };

  // Header: the shop.
  text(content.shop.name, 16, { bold: true, gap: 2 });
  for (const l of content.shop.lines) text(l, 9, { color: MUTED, gap: 1 });
  rule();
  text(content.title, 18, { bold: true, gap: 4 });
  text(`Status: ${content.status}`, 10, { color: MUTED, gap: 8 });

  // Facts as label: value rows.
  for (const f of content.facts) {
    const y = doc.y;
    doc.fontSize(9.5).fillColor(MUTED);
    write(doc, f.label, 'SansSemi', 'SansExtBold', { width: 110 }, [40, y]);
    doc.fontSize(10.5).fillColor(INK);
    write(doc, f.value, 'Sans', 'SansExt', { width: width - 115 }, [155, y]);
    doc.x = 40;
    doc.moveDown(0.35);
  }
  rule();

  heading(content.copy === 'advisor' ? 'Confirmed cause' : 'What we found');
  if (content.cause) {
    text(content.cause.headline, 14, { bold: true, gap: 4 });
    for (const d of content.cause.detail) text(d, 10, { gap: 3 });
    if (content.confirmation) text(content.confirmation, 10, { color: MUTED, gap: 6 });
  } else {
    text('No cause has been confirmed yet.', 10, { color: MUTED, gap: 6 });
  }

  if (evidenceSvg && content.evidenceCaption) {
    ensure(EVIDENCE_SIZE.height + 40);
    doc.moveDown(0.4);
    const y = doc.y;
    SVGtoPDF(doc, evidenceSvg, 40, y, {
      width: EVIDENCE_SIZE.width, height: EVIDENCE_SIZE.height, assumePt: true,
      fontCallback: (family, bold) => (/mono/i.test(family) ? 'Mono' : bold ? 'SansBold' : 'Sans'),
    });
    doc.x = 40;
    doc.y = y + EVIDENCE_SIZE.height + 4;
    text(content.evidenceCaption, 8.5, { color: MUTED, gap: 8 });
  }

  if (content.beforeAfter) {
    ensure(60 + 16 * content.beforeAfter.rows.length);
    heading(content.copy === 'advisor' ? 'Before and after the repair' : 'After the repair');
    if (content.beforeAfter.rows.length > 0) {
      const cols = [
        { key: 'line', label: 'Line', w: 150 }, { key: 'order', label: 'Order', w: 55 }, { key: 'before', label: 'Before', w: 110 },
        { key: 'after', label: 'After', w: 110 }, { key: 'change', label: 'Change', w: 80 },
      ] as const;
      let x = 40;
      const top = doc.y;
      for (const c of cols) {
        doc.font('SansSemi').fontSize(9).fillColor(MUTED).text(c.label, x, top, { width: c.w });
        x += c.w;
      }
      doc.y = top + 14;
      for (const r of content.beforeAfter.rows) {
        x = 40;
        const y = doc.y;
        for (const c of cols) {
          doc.fontSize(9.5).fillColor(INK);
          write(doc, r[c.key], c.key === 'line' ? 'Sans' : 'Mono', 'SansExt', { width: c.w }, [x, y]);
          x += c.w;
        }
        doc.y = y + 15;
      }
      doc.x = 40;
      doc.moveDown(0.3);
    }
    text(content.beforeAfter.verdict, 10.5, { semi: true, gap: 6 });
  }

  ensure(120);
  rule();
  heading('Safety');
  for (const c of content.cautions) text(`• ${c}`, 9, { color: AMBER, gap: 2 });
  doc.moveDown(0.5);
  text(content.footer, 8, { color: MUTED });
  doc.end();
  return done;
}
