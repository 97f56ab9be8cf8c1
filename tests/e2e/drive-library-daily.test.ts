import { readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../../server/services/demo-shop';
import { freePort, startTestServer } from '../helpers/test-server';
import { launchChromium, screenshot } from '../helpers/browser';

// Issue 17 in the browser, against the BUILT app with the demo shop: an engine created from
// scratch with a second belt (item 1), the CSV import preview and every bad row at once (item 3),
// the unsaved-edit blocker and the edit history (item 4), read-only views and built-in bearings
// (item 5), and the phone layout and the deactivated-account message (item 14). Screenshots at
// 1440, 1024 and 390 pixels go to tests/e2e/screenshots/ (git-ignored) for a person to look at.

const user = (role: string) => DEMO_USERS.find((u) => u.role === role)!;
const lead = user('lead');
const tech = user('tech');
const admin = user('admin');
const specialist = user('specialist');

let browser: Browser;
let server: { baseUrl: string; stop: () => Promise<void> };
const engineName = `Quarry I4 ${Date.now().toString(36)}`;
let engineUrl = '';

beforeAll(async () => {
  server = await startTestServer({ port: await freePort() });
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function signedIn(who: { email: string; password: string }, width = 1440): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ viewport: { width, height: width < 500 ? 844 : 900 } });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`pageerror: ${error.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource.*\b(400|401|403|409)\b/.test(m.text())) problems.push(`console.error: ${m.text()}`);
  });
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1 }).first().waitFor();
  return { page, problems };
}

async function shotAt(page: Page, name: string, widths = [1440, 1024, 390]) {
  for (const width of widths) {
    await page.setViewportSize({ width, height: width < 500 ? 844 : 900 });
    await page.waitForTimeout(150);
    await screenshot(page, `${name}-${width}`);
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

describe('Drive library fit for daily use (issue 17)', () => {
  it('creates an engine from scratch with a second belt; a refused save scrolls to the field, outlines it and says what to do (item 1)', async () => {
    const { page, problems } = await signedIn(lead);
    await page.goto(`${server.baseUrl}/drive-library/new`);
    await page.getByLabel('Engine name').fill(engineName);
    await page.getByRole('button', { name: 'Add belt' }).click();
    await page.getByLabel('Belt 1 name').fill('Main');
    // Typing the belt's name never puts the crankshaft on it.
    expect(await page.getByTestId('component-row-0').getByText('drives belts').count()).toBe(1);
    await page.getByLabel('Belt 1 length').fill('1900');
    await page.getByLabel('Belt 1 driver groove').fill('160');
    await page.getByRole('button', { name: 'Add component' }).click();
    await page.getByLabel('Name of row 2').fill('Alternator');
    await page.getByLabel('Kind of row 2').selectOption('alternator');
    await page.getByLabel('Belt of row 2').selectOption('Main');
    // Second belt, driven by the crank's second groove.
    await page.getByRole('button', { name: 'Add belt' }).click();
    await page.getByLabel('Belt 2 name').fill('A/C');
    await page.getByLabel('Belt 2 length').fill('1200');
    await page.getByLabel('Belt 2 driver groove').fill('150');
    await page.getByRole('button', { name: 'Add component' }).click();
    await page.getByLabel('Name of row 3').fill('Compressor');
    await page.getByLabel('Kind of row 3').selectOption('ac_compressor');
    await page.getByLabel('Belt of row 3').selectOption('A/C');
    await page.getByLabel('Pulley mm of row 3').fill('120');
    // The alternator's pulley is still empty: the save is refused at that cell.
    await page.getByRole('button', { name: 'Create engine' }).click();
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/Enter the pulley diameter/);
    const focused = await page.evaluate(() => document.activeElement?.getAttribute('aria-label'));
    expect(focused).toBe('Pulley mm of row 2');
    expect(await page.getByLabel('Pulley mm of row 2').getAttribute('aria-invalid')).toBe('true');
    await shotAt(page, 'i17-new-engine-refused', [1440]);
    // Measured across the ribs: 54 mm outside + the 2 mm grooved offset = 56 mm effective.
    await page.getByLabel('Pulley measured as, row 2').selectOption('outside');
    await page.getByLabel('Outside mm of row 2').fill('54');
    await page.getByTestId('component-row-1').getByText('effective 56.0 mm').waitFor();
    // 160 / 56 = 2.857 (the alternator's shaft order), 150 / 120 = 1.250.
    expect(await page.getByTestId('component-row-1').getByText('2.857').count()).toBe(1);
    expect(await page.getByTestId('component-row-2').getByText('1.250').count()).toBe(1);
    await page.getByRole('button', { name: 'Create engine' }).click();
    await page.getByRole('heading', { name: engineName }).waitFor();
    engineUrl = page.url();
    expect(await page.getByLabel('Outside mm of row 2').inputValue()).toBe('54');
    await shotAt(page, 'i17-engine-created');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('asks before leaving with unsaved edits, and records each save in the edit history (item 4)', async () => {
    const { page, problems } = await signedIn(lead);
    await page.goto(engineUrl);
    await page.getByLabel('Pulley mm of row 3').fill('118');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bearings' }).click();
    const dialog = page.getByRole('dialog', { name: 'Leave without saving?' });
    await dialog.waitFor();
    await shotAt(page, 'i17-unsaved-blocker', [1440]);
    await dialog.getByRole('button', { name: 'Stay on this page' }).click();
    expect(new URL(page.url()).pathname).toBe(new URL(engineUrl).pathname);
    expect(await page.getByLabel('Pulley mm of row 3').inputValue()).toBe('118');
    await page.getByRole('button', { name: 'Save engine' }).click();
    await page.getByText('Unsaved changes').waitFor({ state: 'detached' });
    const history = page.getByRole('list', { name: 'Edit history' });
    await history.getByText(/Pulley diameter 120 → 118/).waitFor();
    expect(await history.innerText()).toMatch(/saved · version 2/);
    // Saved: leaving now asks nothing.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bearings' }).click();
    await page.getByRole('table', { name: 'Bearings' }).waitFor();
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('previews a CSV import (added, changed, removed) before replacing, and lists every bad row with line and column (item 3)', async () => {
    const { page, problems } = await signedIn(lead);
    await page.goto(engineUrl);
    const id = new URL(engineUrl).pathname.split('/').pop();
    const exported = await page.request.get(`${server.baseUrl}/api/engines/${id}/export.csv`);
    const csv = await exported.text();
    expect(csv.startsWith('[engine]')).toBe(true);
    const lines = csv.trimEnd().split('\r\n');
    const changed = lines.map((l) => (l.startsWith('Compressor,') ? l.replace(',118,', ',121,') : l));
    changed.push('Idler,idler,Main,70,,,,,,,,,,,,,outer,,');
    const good = path.join(os.tmpdir(), `i17-${Date.now()}-good.csv`);
    writeFileSync(good, `${changed.join('\r\n')}\r\n`);
    await page.getByLabel('Engine CSV file').setInputFiles(good);
    const preview = page.getByRole('dialog', { name: 'Import this CSV?' });
    await preview.waitFor();
    expect(await preview.innerText()).toMatch(/Parts: 1 added, 1 changed, 0 removed/);
    expect(await preview.innerText()).toMatch(/Part "Compressor": Pulley diameter 118 → 121/);
    await shotAt(page, 'i17-csv-preview', [1440, 390]);
    await preview.getByRole('button', { name: 'Replace with the file' }).click();
    await page.getByText(/Imported \d+ rows/).waitFor();
    await page.getByTestId('component-row-3').waitFor();

    const bad = changed.map((l) => (l.startsWith('Alternator,') ? l.replace(',Main,', ',Serpentine,') : l.startsWith('Compressor,') ? l.replace(',121,', ',900,') : l.startsWith('Idler,') ? l.replace(',70,', ',abc,') : l));
    const badFile = path.join(os.tmpdir(), `i17-${Date.now()}-bad.csv`);
    writeFileSync(badFile, `${bad.join('\r\n')}\r\n`);
    await page.getByLabel('Engine CSV file').setInputFiles(badFile);
    const report = page.getByRole('dialog', { name: 'The CSV was not imported' });
    await report.waitFor();
    const text = await report.innerText();
    expect(text).toMatch(/Fix these 3 problem/);
    expect(text).toMatch(/Line \d+, column belt \(Belt\): There is no belt "Serpentine"/);
    expect(text).toMatch(/Line \d+, column pulleyMm \(Pulley diameter\): Pulley diameter must be between 20 and 400 mm \(got 900\)/);
    expect(text).toMatch(/Line \d+, column pulleyMm \(Pulley diameter\): Pulley diameter must be a number, got "abc"/);
    await shotAt(page, 'i17-csv-problems', [1440]);
    expect(readFileSync(good, 'utf8')).toContain('Idler');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('shows technicians read-only text, tells them they cannot create engines, and lists built-in bearings (item 5)', async () => {
    const { page, problems } = await signedIn(tech);
    await page.goto(engineUrl);
    await page.getByText('read only').waitFor();
    expect(await page.locator('main input, main select, main textarea').count()).toBe(0);
    expect(await page.getByText('Give a designation from the Bearings page').count()).toBe(0);
    await page.getByRole('list', { name: 'Edit history' }).waitFor();
    await shotAt(page, 'i17-engine-readonly');
    await page.goto(`${server.baseUrl}/drive-library/new`);
    await page.getByText('Only lead technicians and admins create engines').waitFor();
    await page.goto(`${server.baseUrl}/bearings`);
    const table = page.getByRole('table', { name: 'Bearings' });
    await table.waitFor();
    const row6204 = table.getByRole('row').filter({ hasText: '6204' });
    expect(await row6204.innerText()).toMatch(/built-in/);
    expect(await row6204.innerText()).toMatch(/estimated/);
    expect(await table.getByRole('button', { name: /Copy .* to edit/ }).count()).toBe(0);
    await shotAt(page, 'i17-bearings');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('on a 390-pixel phone reaches every section through the menu and keeps wide tables inside their card (item 14)', async () => {
    const { page, problems } = await signedIn(admin, 390);
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.isVisible()).toBe(false);
    await page.getByRole('button', { name: 'Menu' }).click();
    const links = nav.getByRole('link');
    expect(await links.allInnerTexts()).toEqual(['Cases', 'Drive library', 'Bearings', 'Capture planner', 'Team', 'Outbox', 'Shop setup']);
    for (const link of await links.all()) {
      const box = await link.boundingBox();
      expect(box && box.x >= 0 && box.x + box.width <= 390).toBe(true);
    }
    await screenshot(page, 'i17-phone-menu-390');
    await links.filter({ hasText: 'Drive library' }).click();
    await page.getByRole('table', { name: 'Engines' }).waitFor();
    expect(await nav.isVisible()).toBe(false);
    await page.goto(engineUrl);
    await page.getByTestId('component-row-0').waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'i17-engine-390');
    for (const p of ['/shop-setup', '/capture-planner']) {
      await page.goto(`${server.baseUrl}${p}`);
      await page.getByRole('heading', { level: 1 }).waitFor();
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    }
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${server.baseUrl}/shop-setup`);
    await page.getByLabel('Address').waitFor();
    await shotAt(page, 'i17-shop-setup');
    await page.goto(`${server.baseUrl}/capture-planner`);
    await page.getByText('Record at least', { exact: true }).waitFor();
    await shotAt(page, 'i17-capture-planner');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('tells a deactivated user with the right password that the account is deactivated (item 14)', async () => {
    const { page: adminPage } = await signedIn(admin);
    await adminPage.goto(`${server.baseUrl}/team`);
    const row = adminPage.getByRole('row').filter({ hasText: specialist.email });
    await row.getByRole('button', { name: 'Deactivate' }).click();
    await adminPage.getByRole('dialog').getByRole('button', { name: 'Deactivate' }).click();
    await row.getByText('Deactivated').waitFor();
    try {
      const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
      const page = await context.newPage();
      await page.goto(`${server.baseUrl}/sign-in`);
      await page.getByLabel('E-mail').fill(specialist.email);
      await page.getByLabel('Password').fill(specialist.password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByText(/This account is deactivated\. Ask your shop's admin/).waitFor();
      await screenshot(page, 'i17-deactivated-390');
      await page.getByLabel('Password').fill('not the password at all');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByText('E-mail or password is wrong').waitFor();
      await context.close();
    } finally {
      await row.getByRole('button', { name: 'Reactivate' }).click();
      await row.getByText('Active').waitFor();
      await adminPage.context().close();
    }
  });
});
