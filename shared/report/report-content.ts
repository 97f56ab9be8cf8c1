/**
 * The words of a case report, built once from the case and used by the print page (client), the
 * PDF and the e-mail (server), so all three say the same. Two copies: the advisor's (evidence,
 * orders, line changes in dB) and the customer's (plain words, no orders or decibels).
 */
import type { FindingDto } from '../schemas/analyses';
import type { CaseDto } from '../schemas/cases';
import { faultWords } from '../ranking/evidence';
import { compareRepair, type RepairVerdict } from './repair-verification';

export type ReportCopy = 'advisor' | 'customer';

/** The shop block of the header: the name always, address/phone/e-mail where Shop setup has them. */
export interface ReportShop {
  name: string;
  address?: string | null;
  phone?: string | null;
  email?: string | null;
}

/** A before/after row of the report. */
export interface ReportLineRow {
  line: string;
  order: string;
  before: string;
  after: string;
  change: string;
}

/** Everything a report shows, as text. */
export interface ReportContent {
  copy: ReportCopy;
  title: string;
  shop: { name: string; lines: string[] };
  facts: { label: string; value: string }[];
  cause: { headline: string; detail: string[] } | null;
  confirmation: string | null;
  /** Caption of the evidence plot (advisor copy), or null when the report has none. */
  evidenceCaption: string | null;
  beforeAfter: { rows: ReportLineRow[]; verdict: string } | null;
  status: string;
  cautions: string[];
  footer: string;
}

/** The workshop cautions printed on every report (trade practice; the shop's rules come first). */
export const REPORT_CAUTIONS = [
  'Keep hands, tools, leads, clothing and hair away from belts, pulleys and fans while the engine runs.',
  'Electric cooling fans can start on their own, even with the engine off.',
  'Exhaust parts and the cooling system get hot; the cooling system is under pressure.',
  'Ignition voltage is tens of kilovolts: attach and remove pickups with the engine off.',
  'Follow your shop’s rules and local regulations; they come first.',
];

/** Plain words for a part and fault in the customer's copy. */
function customerFault(component: string, fault: string | null): string {
  switch (fault) {
    case 'outer_race':
    case 'inner_race':
    case 'ball':
    case 'cage':
      return `a worn bearing in the ${component.toLowerCase()}`;
    case 'shaft':
      return `the ${component.toLowerCase()} turning out of balance or out of line`;
    case 'belt':
      return `the drive belt (${component})`;
    default:
      return `the ${component.toLowerCase()}`;
  }
}

const dateText = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

const STATUS_WORDS: Record<string, string> = {
  open: 'Open', testing: 'Testing', ranked: 'Suspects ranked', confirmed: 'Cause confirmed', verified: 'Repair verified', closed: 'Closed',
};

function lineRows(v: RepairVerdict): ReportLineRow[] {
  return v.lines.map((l) => ({
    line: l.label.replace(/(\d)x/g, '$1×') + (l.main ? ' (main)' : ''),
    order: l.nominalOrder.toFixed(2),
    before: `${l.beforeSnrDb.toFixed(0)} dB over floor`,
    after: l.afterSnrDb === null ? 'not found' : `${l.afterSnrDb.toFixed(0)} dB over floor`,
    change: l.changeDb === null ? (l.afterAmplitude === null ? 'gone' : '—') : `${l.changeDb > 0 ? '+' : ''}${l.changeDb.toFixed(1)} dB`,
  }));
}

/** Builds the report's text for one copy. */
export function reportContent(c: CaseDto, shop: ReportShop, copy: ReportCopy): ReportContent {
  const confirmedFinding: FindingDto | null = c.confirmed?.findingId ? c.findings.find((f) => f.id === c.confirmed!.findingId) ?? null : null;
  const vehicle = [c.vehicleLabel, c.vehicle.vin ? `VIN ${c.vehicle.vin}` : null].filter(Boolean).join(' · ');
  const facts: { label: string; value: string }[] = [
    { label: 'Repair order', value: c.roNumber },
    { label: 'Vehicle', value: vehicle },
  ];
  if (c.vehicle.odometer !== null) facts.push({ label: 'Odometer', value: `${c.vehicle.odometer.toLocaleString('en-GB')} ${c.vehicle.odometerUnit}` });
  if (copy === 'advisor' && c.engine) facts.push({ label: 'Engine', value: c.engine.name });
  facts.push({ label: 'Complaint', value: c.complaint });
  if (copy === 'advisor') {
    if (c.technician) facts.push({ label: 'Technician', value: c.technician.name });
    if (c.lead) facts.push({ label: 'Lead technician', value: c.lead.name });
  }

  let cause: ReportContent['cause'] = null;
  if (c.confirmed) {
    const fault = c.confirmed.fault;
    if (copy === 'advisor') {
      const detail: string[] = [];
      if (confirmedFinding) {
        detail.push(`Score ${confirmedFinding.score.toFixed(2)} · line at order ${confirmedFinding.order.toFixed(2)} (expected ${confirmedFinding.nominalOrder.toFixed(2)})${confirmedFinding.slipPct !== null ? ` · belt slip ${confirmedFinding.slipPct.toFixed(1)} %` : ''}.`);
        detail.push(confirmedFinding.evidence);
        for (const n of confirmedFinding.notes) detail.push(n);
      } else {
        detail.push('A part outside the ranked list, confirmed by the lead technician.');
      }
      if (c.confirmed.note) detail.push(`Lead's note: ${c.confirmed.note}`);
      cause = { headline: `${c.confirmed.component}${fault ? ` — ${faultWords(fault as Parameters<typeof faultWords>[0])}` : ''}`, detail };
    } else {
      cause = {
        headline: `The noise comes from ${customerFault(c.confirmed.component, fault)}.`,
        detail: ['We measured the noise with a sensor on the engine and matched it to the speed of each part driven by the belt. This part’s pattern matched the noise.'],
      };
    }
  }
  const confirmation = c.confirmed ? `Confirmed by ${c.confirmed.by?.name ?? 'the lead technician'} on ${dateText(c.confirmed.at)}.` : null;

  let beforeAfter: ReportContent['beforeAfter'] = null;
  if (confirmedFinding) {
    const verdict = compareRepair(confirmedFinding);
    if (verdict.hasAfter) {
      beforeAfter = copy === 'advisor'
        ? { rows: lineRows(verdict), verdict: verdict.sentence }
        : {
            rows: [],
            verdict: verdict.passes
              ? 'After the repair we measured again at the same place: the noise from this part is gone or clearly quieter.'
              : 'After the repair we measured again at the same place; the technician reviewed the result with the lead technician.',
          };
    }
  }
  return {
    copy,
    title: copy === 'advisor' ? `Noise diagnosis · ${c.roNumber}` : 'What we found and fixed',
    shop: { name: shop.name, lines: [shop.address, shop.phone, shop.email].filter((x): x is string => !!x && x.trim() !== '') },
    facts,
    cause,
    confirmation,
    evidenceCaption: copy === 'advisor' && confirmedFinding
      ? `Order spectrum and envelope of the capture the part was found in; ${c.confirmed!.component}'s candidate lines marked.`
      : null,
    beforeAfter,
    status: STATUS_WORDS[c.status] ?? c.status,
    cautions: REPORT_CAUTIONS,
    footer: `${copy === 'advisor' ? 'Advisor copy' : 'Customer copy'} · ${shop.name} · made with Crankwise`,
  };
}
