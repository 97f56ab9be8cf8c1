import { describe, expect, it } from 'vitest';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { DriveDocument } from '../../../shared/drive/types';
import { reportContent } from '../../../shared/report/report-content';
import { evidenceSvg } from '../../../server/services/report-chart';
import { renderReportPdf } from '../../../server/services/report-pdf';
import { confirmedCase } from '../../helpers/report-case';
import { pdfText } from '../../helpers/pdf-text';

const drive = {
  name: 'I4', cylinders: 4, firingOrder: [1, 3, 4, 2],
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [{ name: 'Crankshaft', kind: 'crankshaft' }, { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56 }],
} as DriveDocument;

function spectrum(n: number, resolution: number, lineAt: number) {
  const order: number[] = [];
  const amplitude: number[] = [];
  for (let k = 0; k < n; k += 1) {
    order.push(k * resolution);
    amplitude.push(Math.abs(k * resolution - lineAt) < resolution / 2 ? 0.05 : 0.002);
  }
  return { order, amplitude, resolution };
}

describe('report PDF', () => {
  it('renders the evidence plot to SVG on the server with the part markers', () => {
    const svg = evidenceSvg({ orders: spectrum(640, 1 / 32, 2.62), envelope: spectrum(640, 1 / 32, 8.0), candidates: candidateLines(drive), cylinders: 4, scale: 'linear', unit: 'g', focus: 'Alternator' });
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('Alternator');
  });

  it('holds the shop, the case, the confirmed part, the before/after figures and the cautions as text', async () => {
    const content = reportContent(confirmedCase(), { name: 'Larkspur Lane Auto Care', phone: '+1 555 0100' }, 'advisor');
    const svg = evidenceSvg({ orders: spectrum(640, 1 / 32, 2.62), envelope: null, candidates: candidateLines(drive), cylinders: 4, scale: 'linear', unit: 'g' });
    const pdf = await renderReportPdf(content, svg);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const { text } = await pdfText(pdf);
    for (const want of ['Larkspur Lane Auto Care', 'RO-48213', 'Alternator', 'outer race', 'Lena Lead', '-14.0 dB', 'cooling fans']) {
      expect(text).toContain(want);
    }
  });

  it('sets text outside Latin-1 (a Polish or Czech name) with the latin-ext font without failing', async () => {
    const c = confirmedCase();
    c.technician = { id: 3, name: 'Łukasz Dvořák', role: 'tech' };
    const { text } = await pdfText(await renderReportPdf(reportContent(c, { name: 'Warsztat Żoliborz' }, 'advisor'), null));
    expect(text).toContain('Łukasz Dvořák');
    expect(text).toContain('Warsztat Żoliborz');
  });
});
