import { describe, expect, it } from 'vitest';
import { reportContent } from '../../../shared/report/report-content';
import { confirmedCase } from '../../helpers/report-case';

describe('report content', () => {
  const shop = { name: 'Larkspur Lane Auto Care' };

  it('advisor copy names the part and fault, who confirmed and when, and the line changes in dB', () => {
    const r = reportContent(confirmedCase(), shop, 'advisor');
    expect(r.cause?.headline).toBe('Alternator — outer race');
    expect(r.confirmation).toBe('Confirmed by Lena Lead on 3 December 2026.');
    expect(r.beforeAfter?.rows[0]).toMatchObject({ line: 'BPFO 1× (main)', change: '-14.0 dB' });
    expect(r.facts.find((f) => f.label === 'Engine')?.value).toBe('Demo 1.6 I4 petrol');
    expect(r.cautions.length).toBeGreaterThan(3);
  });

  it('customer copy says it in plain words, with no orders or decibels', () => {
    const r = reportContent(confirmedCase(), shop, 'customer');
    const all = JSON.stringify(r);
    expect(r.cause?.headline).toBe('The noise comes from a worn bearing in the alternator.');
    expect(all).not.toMatch(/\bdB\b|\border\b \d/);
    expect(r.facts.some((f) => f.label === 'Engine')).toBe(false);
  });

  it('uses the shop fields it has and leaves out the ones it has not', () => {
    expect(reportContent(confirmedCase(), { name: 'A', phone: '+1 555 0100', address: '' }, 'advisor').shop.lines).toEqual(['+1 555 0100']);
  });
});
