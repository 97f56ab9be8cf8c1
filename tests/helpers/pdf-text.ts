// Reads the text of a PDF with pdfjs-dist 5.6.205 through its legacy build (the modern build needs
// Node 22.13+). Used by the report tests and the browser walk-through.
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/**
 * All text of every page, pages joined by a blank line. Items that touch on one baseline (a word
 * set in two font runs) are joined directly, others by a space.
 */
export async function pdfText(data: Uint8Array): Promise<{ text: string; pages: number }> {
  const pdf = await getDocument({ data: new Uint8Array(data), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let p = 1; p <= pdf.numPages; p += 1) {
    const page = await pdf.getPage(p);
    const content = await page.getTextContent();
    let text = '';
    let end: { x: number; y: number } | null = null;
    for (const item of content.items) {
      if (!('str' in item)) continue;
      const [, , , , x, y] = item.transform as number[];
      const touches = end !== null && Math.abs(y! - end.y) < 0.5 && Math.abs(x! - end.x) < 0.5;
      text += (text === '' || touches ? '' : ' ') + item.str;
      end = { x: x! + item.width, y: y! };
    }
    pages.push(text);
  }
  await pdf.destroy();
  return { text: pages.join('\n\n'), pages: pdf.numPages };
}
