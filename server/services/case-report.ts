/**
 * The case report (issue 16 item 7) and the case export (zip for warranty claims): the words come
 * from shared/report/report-content.ts (the same the print page shows), the evidence plot is the
 * Orders view of the before-repair capture in which the confirmed suspect scored best, rendered to
 * SVG on the server, and the PDF is made by report-pdf.ts. Sending mails the HTML body with the
 * PDF attached through the mail set-up and records `report_sent` on the timeline.
 */
import { zipSync, strToU8 } from 'fflate';
import { candidateLines } from '../../shared/drive/candidate-lines';
import type { DriveDocument } from '../../shared/drive/types';
import type { Peak } from '../../shared/analysis/types';
import type { LineSeriesDto } from '../../shared/schemas/analyses';
import type { CaseDto } from '../../shared/schemas/cases';
import { fileSlug, toCsv } from '../../shared/plots/csv';
import { reportContent, type ReportContent, type ReportCopy, type ReportShop } from '../../shared/report/report-content';
import { AppError } from '../errors';
import type { Mailer } from '../mail/mailer';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Shop } from '../models/shop';
import type { ObjectStorage } from '../storage/storage';
import { getCaseDetail } from './case-detail';
import { appendTimeline } from './case-timeline';
import { exportEngineJson } from './engine-io';
import { evidenceSvg } from './report-chart';
import { renderReportPdf } from './report-pdf';
import { seriesView } from './series-view';

/** The shop's header fields: the name always; address, phone and e-mail where Shop setup stores them. */
export async function reportShop(shopId: number): Promise<ReportShop> {
  const shop = await Shop.findByPk(shopId);
  if (!shop) return { name: 'Crankwise' };
  const field = (name: string) => {
    const v = (shop.get({ plain: true }) as Record<string, unknown>)[name];
    return typeof v === 'string' && v.trim() !== '' ? v : null;
  };
  return { name: shop.name, address: field('address'), phone: field('phone'), email: field('email') ?? field('contactEmail') };
}

function peaksOf(summary: Record<string, unknown> | null, key: 'orders' | 'envelope'): Peak[] {
  const part = summary?.[key] as { peaks?: Peak[] } | undefined;
  return Array.isArray(part?.peaks) ? part.peaks : [];
}

/** The evidence plot as SVG, or null when the confirmed cause has no analysed before-repair capture. */
export async function reportEvidenceSvg(shopId: number, c: CaseDto): Promise<string | null> {
  const finding = c.confirmed?.findingId ? c.findings.find((f) => f.id === c.confirmed!.findingId) : undefined;
  if (!finding) return null;
  const best = finding.captures.filter((x) => x.phase === 'before').sort((a, b) => b.score - a.score)[0];
  if (!best) return null;
  const capture = await Capture.findOne({ where: { id: best.captureId, shopId } });
  if (!capture?.currentAnalysisId) return null;
  const analysis = await Analysis.findOne({ where: { id: capture.currentAnalysisId, shopId } });
  if (!analysis || analysis.status !== 'done') return null;
  let drive: DriveDocument | null = analysis.driveSnapshot ?? null;
  if (!drive && c.engine) drive = await exportEngineJson(shopId, c.engine.id);
  if (!drive) return null;
  const orders = (await seriesView(analysis, 'orders', { points: 4000, band: 0 })) as LineSeriesDto;
  let envelope: LineSeriesDto | null = null;
  try {
    envelope = (await seriesView(analysis, 'envelope', { points: 4000, band: 0 })) as LineSeriesDto;
  } catch {
    envelope = null;
  }
  const summary = analysis.summary as Record<string, unknown> | null;
  const resolution = Number((summary?.orders as { resolution?: number } | undefined)?.resolution ?? orders.x[1] ?? 0.03);
  const envResolution = Number((summary?.envelope as { resolution?: number } | undefined)?.resolution ?? resolution);
  return evidenceSvg({
    orders: { order: orders.x, amplitude: orders.y, resolution, peaks: peaksOf(summary, 'orders') },
    envelope: envelope ? { order: envelope.x, amplitude: envelope.y, resolution: envResolution, bandHz: envelope.bandHz, peaks: peaksOf(summary, 'envelope') } : null,
    candidates: candidateLines(drive), cylinders: drive.cylinders, scale: 'linear', unit: orders.yUnit, focus: finding.component,
  });
}

/** The report of a case as content and PDF. */
export async function caseReport(shopId: number, caseId: number, copy: ReportCopy): Promise<{ content: ReportContent; pdf: Buffer; caseDto: CaseDto }> {
  const caseDto = await getCaseDetail(shopId, caseId);
  const content = reportContent(caseDto, await reportShop(shopId), copy);
  const svg = copy === 'advisor' ? await reportEvidenceSvg(shopId, caseDto) : null;
  return { content, pdf: await renderReportPdf(content, svg), caseDto };
}

/** The PDF's file name, e.g. "ro-48213-advisor-report.pdf". */
export const reportFileName = (roNumber: string, copy: ReportCopy) => `${fileSlug(roNumber)}-${copy}-report.pdf`;

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

/** The report's e-mail: a short HTML body saying the same as the PDF's first page, and plain text. */
export function reportMail(content: ReportContent, link: string): { subject: string; text: string; html: string } {
  const lines = [
    content.cause ? content.cause.headline : 'No cause has been confirmed yet.',
    ...(content.confirmation ? [content.confirmation] : []),
    ...(content.beforeAfter ? [content.beforeAfter.verdict] : []),
  ];
  const facts = content.facts.map((f) => `${f.label}: ${f.value}`);
  const text = [`${content.title} — ${content.shop.name}`, '', ...facts, '', ...lines, '', 'The full report is attached as a PDF.', link, '', 'Safety:', ...content.cautions.map((c) => `- ${c}`)].join('\n');
  const html = [
    `<h2 style="font-family:Inter,Arial,sans-serif;margin:0 0 4px">${esc(content.title)}</h2>`,
    `<p style="color:#5c646f;margin:0 0 12px">${esc(content.shop.name)}${content.shop.lines.length ? ` · ${esc(content.shop.lines.join(' · '))}` : ''}</p>`,
    `<table style="border-collapse:collapse;font-family:Inter,Arial,sans-serif;font-size:14px">${content.facts.map((f) => `<tr><td style="padding:2px 12px 2px 0;color:#5c646f">${esc(f.label)}</td><td style="padding:2px 0">${esc(f.value)}</td></tr>`).join('')}</table>`,
    ...lines.map((l, i) => `<p style="font-family:Inter,Arial,sans-serif;${i === 0 ? 'font-size:18px;font-weight:700' : ''}">${esc(l)}</p>`),
    '<p>The full report is attached as a PDF.</p>',
    `<p><a href="${esc(link)}">Open the case in Crankwise</a></p>`,
    `<p style="color:#5b3106;font-size:12px">${content.cautions.map(esc).join('<br>')}</p>`,
  ].join('\n');
  return { subject: `${content.copy === 'advisor' ? 'Diagnosis report' : 'Customer report'} ${content.facts[0]?.value ?? ''} — ${content.cause?.headline ?? 'no cause confirmed yet'}`.slice(0, 200), text, html };
}

/** Mails the report to the case's service advisor (or `to`), with the PDF attached; records `report_sent`. */
export async function sendCaseReport(
  actor: { id: number; shopId: number; name: string },
  caseId: number,
  options: { copy: ReportCopy; to?: string },
  deps: { mailer: Mailer; publicUrl: string },
): Promise<{ sentTo: string }> {
  const { content, pdf, caseDto } = await caseReport(actor.shopId, caseId, options.copy);
  const to = options.to?.trim() || caseDto.advisorEmail;
  if (!to) throw new AppError(409, 'advisor_email_missing', "The case has no service advisor's e-mail: add it on the case (Edit) and send again");
  if (!caseDto.confirmed) throw new AppError(409, 'not_confirmed', 'Confirm the cause before sending the report');
  const mail = reportMail(content, `${deps.publicUrl}/cases/${caseId}`);
  await deps.mailer.send({
    to, subject: mail.subject, text: mail.text, html: mail.html, shopId: actor.shopId,
    attachments: [{ filename: reportFileName(caseDto.roNumber, options.copy), content: pdf, contentType: 'application/pdf' }],
  });
  await appendTimeline({
    shopId: actor.shopId, caseId, actorId: actor.id, kind: 'report_sent',
    message: `${actor.name} sent the ${options.copy === 'advisor' ? 'advisor' : 'customer'} report to ${to}`, data: { to, copy: options.copy },
  });
  return { sentTo: to };
}

async function readAll(storage: ObjectStorage, key: string): Promise<Uint8Array> {
  const stream = await storage.get(key);
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array));
  return new Uint8Array(Buffer.concat(chunks));
}

/**
 * The case export: the capture files as uploaded, the case and every analysis summary as JSON,
 * the findings and their matched lines as CSV, and the advisor report PDF.
 */
export async function caseExportZip(shopId: number, caseId: number, storage: ObjectStorage): Promise<{ name: string; zip: Uint8Array }> {
  const { pdf, caseDto } = await caseReport(shopId, caseId, 'advisor');
  const files: Record<string, Uint8Array> = {};
  const captures = await Capture.findAll({ where: { caseId, shopId }, order: [['id', 'ASC']] });
  for (const cap of captures) {
    const safe = cap.originalName.replace(/[^\w.\- ]+/g, '_');
    files[`captures/${cap.id}-${safe}`] = await readAll(storage, cap.storageKey);
  }
  files['results/case.json'] = strToU8(`${JSON.stringify(caseDto, null, 2)}\n`);
  for (const cap of caseDto.captures) {
    if (cap.analysis?.summary) files[`results/analysis-capture-${cap.id}.json`] = strToU8(`${JSON.stringify(cap.analysis.summary, null, 2)}\n`);
  }
  const rows: (string | number | null)[][] = [];
  for (const f of caseDto.findings) {
    for (const c of f.captures) {
      for (const l of c.lines) rows.push([f.rank, f.component, f.fault, f.score, f.status, c.captureId, c.phase, c.probePoint, l.label, l.spectrum, l.nominalOrder, l.order, l.amplitude, l.snrDb]);
    }
    if (f.captures.length === 0) rows.push([f.rank, f.component, f.fault, f.score, f.status, null, null, null, null, null, null, null, null, null]);
  }
  files['results/findings.csv'] = strToU8(toCsv(
    ['rank', 'component', 'fault', 'score', 'status', 'capture_id', 'phase', 'probe_point', 'line', 'spectrum', 'nominal_order', 'order', 'amplitude', 'snr_db'], rows));
  files[reportFileName(caseDto.roNumber, 'advisor')] = new Uint8Array(pdf);
  return { name: `${fileSlug(caseDto.roNumber)}-case-export.zip`, zip: zipSync(files, { level: 6 }) };
}
