import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_I4 } from '../../server/db/seeders/demo-engines';
import { DEMO_USERS } from '../../server/services/demo-shop';
import { encodeWav } from '../../shared/synth/encode-wav';
import { generateCapture } from '../../shared/synth/generate-capture';
import { launchChromium, screenshot } from '../helpers/browser';
import { pdfText } from '../helpers/pdf-text';
import { freePort, startTestServer } from '../helpers/test-server';

// The whole job in the browser on the BUILT app and the real database (issue 16 "Done when"): a
// technician opens a case and uploads two captures at two probe points; both analyse; captures
// complete; a specialist dismisses a suspect; the lead confirms the top suspect; an after-repair
// capture is uploaded; the case is verified and closed; the report is sent and arrives in the mail
// fake with a PDF whose text names the confirmed part. Every screen is screenshotted at 1440 and
// 1024 px (tests/e2e/screenshots/, git-ignored) for a person to look at.

const user = (role: string) => DEMO_USERS.find((u) => u.role === role)!;
let browser: Browser;
let server: { baseUrl: string; stop: () => Promise<void> };
let dir: string;
const RO = `RO-E2E-${process.pid}`;

/** A capture of the demo I4 with a planted alternator outer-race fault (or none, after the repair). */
function captureFile(name: string, seed: number, snrDb: number | null): string {
  const gen = generateCapture({
    drive: DEMO_I4, durationS: 6, sampleRateHz: 24000, refKind: 'cyl1', tdcOffsetDeg: 0, creepPct: 1, seed,
    fault: snrDb === null ? null : { component: 'Alternator', fault: 'outer_race' }, ...(snrDb === null ? {} : { snrDb }),
  });
  const file = path.join(dir, name);
  writeFileSync(file, encodeWav(gen.channels, gen.sampleRateHz, 'float32'));
  return file;
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'crankwise-e2e-'));
  server = await startTestServer({ port: process.env.E2E_WORKBENCH_PORT ? Number(process.env.E2E_WORKBENCH_PORT) : await freePort() });
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function signedIn(role: string, width = 1440): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ viewport: { width, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`pageerror: ${error.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource.*\b(401|404|409)\b/.test(m.text())) problems.push(`console.error: ${m.text()}`);
  });
  const u = user(role);
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(u.email);
  await page.getByLabel('Password').fill(u.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

/** Screenshots the current page at 1440 and at 1024 px wide. */
async function shots(page: Page, name: string) {
  await page.waitForTimeout(300);
  await screenshot(page, `${name}-1440`);
  await page.setViewportSize({ width: 1024, height: 900 });
  await page.waitForTimeout(500);
  await screenshot(page, `${name}-1024`);
  await page.setViewportSize({ width: 1440, height: 900 });
}

async function waitAnalysed(page: Page, count: number) {
  await expect.poll(async () => page.getByText('Analysed', { exact: true }).count(), { timeout: 90_000, interval: 1000 }).toBe(count);
}

let casePath = '';

// Uploads wait for real analyses on a shared 2-core machine: each step gets 3 minutes at most.
describe('the workbench, whole job', { timeout: 180_000 }, () => {
  it('a technician opens a case and uploads two captures at two probe points, which analyse; captures complete ranks them', async () => {
    const { page, problems } = await signedIn('tech');
    await page.getByRole('link', { name: 'New case' }).click();
    await page.getByRole('button', { name: 'Open case' }).click();
    // Field errors in a technician's words, from the shared schema.
    await page.getByText('Enter the repair order number').waitFor();
    await page.getByLabel('RO number').fill(RO);
    await page.getByLabel('Year').fill('2016');
    await page.getByLabel('Make').fill('Nordfahrt');
    await page.getByLabel('Model').fill('Kestrel');
    await page.getByLabel('Engine (from the Drive library)').selectOption({ label: DEMO_I4.name });
    await page.getByLabel("Complaint (the customer's words)").fill('Whine at idle from the front of the engine');
    await page.getByLabel('Lead technician').selectOption({ label: user('lead').name });
    await page.getByLabel("Service advisor's e-mail").fill('advisor@e2e.crankwise.test');
    await page.getByRole('button', { name: 'Open case' }).click();
    await page.getByRole('heading', { name: RO }).waitFor();
    casePath = new URL(page.url()).pathname;

    await page.getByLabel('Capture files').setInputFiles([captureFile('alt-front-idle.wav', 7101, 6), captureFile('pump-idle.wav', 7102, -4)]);
    await page.getByLabel('Probe point').first().fill('alternator front housing');
    await page.getByLabel('Nearest part').first().selectOption('Alternator');
    await page.getByLabel('Probe point').nth(1).fill('water pump body');
    await page.getByLabel('Nearest part').nth(1).selectOption('Water pump');
    await shots(page, 'case-upload');
    await page.getByRole('button', { name: 'Upload 2 files' }).click();
    await waitAnalysed(page, 2);
    await page.getByRole('button', { name: 'Captures complete' }).click();
    await page.getByTestId('suspect-1').waitFor();
    expect(await page.getByTestId('suspect-1').innerText()).toContain('Alternator');
    await shots(page, 'case-ranked');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('every view of capture review draws its plot', async () => {
    const { page, problems } = await signedIn('specialist');
    await page.goto(`${server.baseUrl}${casePath}`);
    await page.getByRole('link', { name: 'Review' }).first().click();
    await page.getByRole('img', { name: 'Orders' }).locator('canvas').first().waitFor({ timeout: 30_000 });
    await shots(page, 'review-orders');
    for (const [tab, plot] of [['Engine cycle', 'Engine cycle'], ['Spectrogram', 'Spectrogram'], ['Speed', 'Speed']] as const) {
      await page.getByRole('navigation', { name: 'Views' }).getByRole('link', { name: tab }).click();
      await page.getByRole('img', { name: plot }).locator('canvas').first().waitFor({ timeout: 30_000 });
      await shots(page, `review-${tab.toLowerCase().replace(' ', '-')}`);
    }
    await page.getByRole('navigation', { name: 'Views' }).getByRole('link', { name: 'Listen' }).click();
    await page.getByRole('button', { name: 'Play' }).waitFor();
    await shots(page, 'review-listen');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('a specialist dismisses a suspect with a note', async () => {
    const { page, problems } = await signedIn('specialist');
    await page.goto(`${server.baseUrl}${casePath}`);
    const last = page.getByRole('list', { name: 'Suspects' }).getByRole('listitem').last();
    await last.getByRole('button', { name: 'Dismiss' }).click();
    await page.getByLabel('Note (why)').fill('Its lines sit on engine orders');
    await page.getByRole('dialog').getByRole('button', { name: 'Dismiss' }).click();
    await page.getByText('dismissed', { exact: true }).waitFor();
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('the lead confirms the top suspect; an after-repair capture is uploaded; the case is verified and closed; the report is sent', async () => {
    const { page, problems } = await signedIn('lead');
    await page.goto(`${server.baseUrl}${casePath}`);
    await page.getByTestId('suspect-1').getByRole('button', { name: 'Confirm cause' }).click();
    await page.getByLabel('Note (why)').fill('Bearing rough by hand with the belt off');
    await page.getByRole('dialog').getByRole('button', { name: 'Confirm cause' }).click();
    await page.getByText('confirmed cause').waitFor();

    await page.getByLabel('Capture files').setInputFiles([captureFile('alt-front-after.wav', 7103, null)]);
    await page.getByLabel('Probe point').fill('alternator front housing');
    await page.getByLabel('Nearest part').selectOption('Alternator');
    await page.getByRole('button', { name: 'Upload the file' }).click();
    await waitAnalysed(page, 3);
    await page.getByTestId('repair-verdict').waitFor();
    await shots(page, 'case-repair');
    await page.getByRole('button', { name: 'Mark verified' }).click();
    const dialog = page.getByRole('dialog');
    if (await dialog.isVisible().catch(() => false)) {
      await page.getByLabel('Note (why)').fill('Customer confirms the whine is gone');
      await dialog.getByRole('button', { name: 'Mark verified' }).click();
    }
    await page.getByRole('button', { name: 'Close case' }).click();
    await page.getByText('Closed', { exact: true }).first().waitFor();

    await page.getByRole('link', { name: 'Report' }).click();
    await expect.poll(() => page.getByTestId('report-cause').innerText()).toContain('Alternator');
    await page.getByRole('img', { name: 'Evidence' }).locator('canvas').first().waitFor({ timeout: 30_000 });
    await shots(page, 'report-advisor');
    await page.getByRole('button', { name: 'Send to service advisor' }).click();
    await page.getByText('Report sent to advisor@e2e.crankwise.test').waitFor();
    await page.getByRole('link', { name: 'Customer copy' }).click();
    await expect.poll(() => page.getByTestId('report-cause').innerText()).toContain('worn bearing in the alternator');
    await shots(page, 'report-customer');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('the report arrives in the mail fake with a PDF naming the confirmed part', async () => {
    const { page } = await signedIn('admin');
    const list = await (await page.request.get(`${server.baseUrl}/api/outbox`)).json() as { items: { id: number; to: string; subject: string }[] };
    const mail = list.items.find((m) => m.to.includes('advisor@e2e.crankwise.test') && m.subject.includes(RO));
    expect(mail).toBeDefined();
    const full = await (await page.request.get(`${server.baseUrl}/api/outbox/${mail!.id}`)).json() as { message: { html: string; attachments: { index: number; filename: string; contentType: string }[] } };
    expect(full.message.html).toContain('Alternator');
    const pdfInfo = full.message.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdfInfo).toBeDefined();
    const pdf = await page.request.get(`${server.baseUrl}/api/outbox/${mail!.id}/attachments/${pdfInfo!.index}`);
    const { text } = await pdfText(new Uint8Array(await pdf.body()));
    expect(text).toContain(RO);
    expect(text).toContain('Alternator');
    expect(text).toContain('outer race');
    await page.context().close();
  });

  it('the cases table and the demo cases open at both widths', async () => {
    const { page, problems } = await signedIn('lead');
    await page.getByRole('table', { name: 'Cases' }).waitFor();
    await shots(page, 'cases');
    await page.getByRole('link', { name: 'RO-20417' }).click();
    await page.getByRole('heading', { name: 'RO-20417' }).waitFor();
    await shots(page, 'case-demo');
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
