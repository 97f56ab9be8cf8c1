import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../../server/services/demo-shop';
import { DEMO_I4 } from '../../server/db/seeders/demo-engines';
import { freePort, startTestServer } from '../helpers/test-server';
import { launchChromium, screenshot, SCREENSHOTS } from '../helpers/browser';

// Browser check of the Drive library on the BUILT app with the demo shop (and its three invented
// demo engines): the engines table, the engine page with computed orders and the belt sketch, an
// edit saved and read back, the read-only view, and the Bearings page. Screenshots go to
// tests/e2e/screenshots/ (git-ignored) for a person to look at.

const lead = DEMO_USERS.find((u) => u.role === 'lead')!;
const tech = DEMO_USERS.find((u) => u.role === 'tech')!;

let browser: Browser;
let server: { baseUrl: string; stop: () => Promise<void> };

beforeAll(async () => {
  // A free port unless one is given, so two suites on one machine never share a server.
  server = await startTestServer({ port: process.env.E2E_DRIVE_PORT ? Number(process.env.E2E_DRIVE_PORT) : await freePort() });
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function signedIn(user: { email: string; password: string }): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`pageerror: ${error.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource.*\b(401|400|409)\b/.test(m.text())) problems.push(`console.error: ${m.text()}`);
  });
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

const shot = screenshot;

describe('Drive library in the browser', () => {
  it('lists the demo engines and opens one with its computed orders and belt sketch', async () => {
    const { page, problems } = await signedIn(lead);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Drive library' }).click();
    const table = page.getByRole('table', { name: 'Engines' });
    await table.waitFor();
    const names = await table.getByRole('link').allInnerTexts();
    expect(names).toEqual(expect.arrayContaining(['Demo 1.6 I4 petrol', 'Demo 2.0 I4 diesel', 'Demo 3.0 V6 petrol']));
    await shot(page, 'drive-library-engines');

    await table.getByRole('link', { name: DEMO_I4.name }).click();
    await page.getByRole('heading', { name: DEMO_I4.name }).waitFor();
    const alternator = page.getByTestId('component-row-1');
    // 148 / 56 = 2.643 (the ratio, i.e. the shaft order).
    expect(await alternator.getByText('2.643').count()).toBe(1);
    const sketch = page.getByRole('img', { name: 'Belt layout sketch' });
    await sketch.waitFor();
    expect(await sketch.locator('circle').count()).toBeGreaterThanOrEqual(2 * DEMO_I4.components.length);
    expect(await sketch.locator('[data-backside] text').first().textContent()).toMatch(/backside/);
    await shot(page, 'drive-library-engine');
    await sketch.screenshot({ path: path.join(SCREENSHOTS, 'drive-library-sketch.png') });
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('edits a copy of an engine, shows a cell error, saves and reads the change back, then deletes the copy', async () => {
    const { page, problems } = await signedIn(lead);
    await page.goto(`${server.baseUrl}/drive-library`);
    await page.getByRole('table', { name: 'Engines' }).getByRole('link', { name: DEMO_I4.name }).click();
    await page.getByRole('button', { name: 'Duplicate' }).click();
    await page.getByRole('heading', { name: `${DEMO_I4.name} (copy)` }).waitFor();
    const pulley = page.getByLabel('Pulley mm of row 2');
    await pulley.fill('5');
    await page.getByRole('button', { name: 'Save engine' }).click();
    await page.getByTestId('component-row-1').getByText(/Pulley diameter must be between 20 and 400 mm/).waitFor();
    await shot(page, 'drive-library-cell-error');
    await pulley.fill('74');
    expect(await page.getByTestId('component-row-1').getByText('2.000').count()).toBe(1);
    await page.getByRole('button', { name: 'Save engine' }).click();
    await page.getByText('Unsaved changes').waitFor({ state: 'detached' });
    await page.reload();
    await page.getByLabel('Pulley mm of row 2').waitFor();
    expect(await page.getByLabel('Pulley mm of row 2').inputValue()).toBe('74');
    await page.getByRole('button', { name: 'Delete' }).click();
    await page.getByRole('button', { name: 'Delete engine' }).click();
    await page.getByRole('table', { name: 'Engines' }).waitFor();
    expect(await page.getByRole('link', { name: `${DEMO_I4.name} (copy)` }).count()).toBe(0);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('shows a technician the engine read-only and the Bearings page with the published rows', async () => {
    const { page, problems } = await signedIn(tech);
    await page.goto(`${server.baseUrl}/drive-library`);
    await page.getByRole('table', { name: 'Engines' }).getByRole('link', { name: 'Demo 3.0 V6 petrol' }).click();
    await page.getByText('read only').waitFor();
    expect(await page.getByRole('button', { name: 'Save engine' }).count()).toBe(0);
    expect(await page.getByLabel('Pulley mm of row 2').count()).toBe(0);
    await shot(page, 'drive-library-engine-v6-readonly');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bearings' }).click();
    const bearings = page.getByRole('table', { name: 'Bearings' });
    await bearings.waitFor();
    const text = await bearings.innerText();
    expect(text).toMatch(/6203/);
    expect(text).toMatch(/6205/);
    expect(text).toMatch(/published/);
    await shot(page, 'bearings');
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
