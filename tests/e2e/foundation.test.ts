import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NAV_LABELS, navSectionsFor, type Role } from '../../shared/auth/roles';
import { DEMO_USERS } from '../../server/services/demo-shop';
import { freePort, startTestServer } from '../helpers/test-server';
import { launchChromium, screenshot } from '../helpers/browser';

// Browser test of the Foundation: the BUILT app (npm test builds first) served by the built server
// against the e2e database with the demo shop, driven through Debian's Chromium.
// Screenshots land in tests/e2e/screenshots/ (git-ignored) for a person to look at.


let browser: Browser;
/** The user the invite test creates; the reset test uses it so the demo users keep their README passwords for other test files. */
let invited: { email: string; password: string } | undefined;
let server: { baseUrl: string; stop: () => Promise<void> };

beforeAll(async () => {
  // A free port unless one is given: several people's suites may run on one machine, and a fixed
  // port would let this test talk to someone else's server.
  server = await startTestServer({ port: process.env.E2E_PORT ? Number(process.env.E2E_PORT) : await freePort() });
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function newPage(): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await context.newPage();
  // Any error the page logs is a failure of the app, not noise.
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`pageerror: ${error.message}`));
  page.on('console', (message) => {
    // A 401 is the API's normal answer to "who am I?" for a visitor; Chromium logs every non-2xx load.
    if (message.type() === 'error' && !/Failed to load resource.*\b401\b/.test(message.text())) {
      problems.push(`console.error: ${message.text()}`);
    }
  });
  (page as Page & { problems: string[] }).problems = problems;
  return page;
}

function problemsOf(page: Page): string[] {
  return (page as Page & { problems: string[] }).problems;
}

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

async function navLabels(page: Page): Promise<string[]> {
  return page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts();
}

/**
 * Opens the newest Outbox message to `to` whose list row does not match `skip`. The server hands
 * mail to its fake after answering, so the message may land a moment later: reload until it is there.
 */
async function openOutboxMessage(page: Page, to: string, skip?: RegExp) {
  await page.goto(`${server.baseUrl}/outbox`);
  let rows = page.getByRole('list', { name: 'Messages' }).getByRole('link').filter({ hasText: to });
  if (skip) rows = rows.filter({ hasNotText: skip });
  for (let attempt = 0; attempt < 40 && (await rows.count()) === 0; attempt += 1) {
    await page.waitForTimeout(250);
    await page.reload();
    await page.getByRole('heading', { name: 'Outbox' }).waitFor();
  }
  await rows.first().click();
}

const shot = screenshot;

describe('Foundation in the browser', () => {
  it('shows the sign-in page to a visitor and sends the app root there', async () => {
    const page = await newPage();
    await page.goto(`${server.baseUrl}/team`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await shot(page, 'sign-in');
    expect(problemsOf(page)).toEqual([]);
    await page.context().close();
  });

  it('refuses a wrong password with the server message', async () => {
    const page = await newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(DEMO_USERS[0].email);
    await page.getByLabel('Password').fill('certainly-not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('Could not sign in').waitFor();
    await shot(page, 'sign-in-refused');
    expect(problemsOf(page)).toEqual([]);
    await page.context().close();
  });

  it.each(DEMO_USERS.map((u) => [u.role, u] as const))('signs in as the demo %s, shows that role’s navigation and signs out', async (role, demo) => {
    const page = await newPage();
    await signIn(page, demo.email, demo.password);
    await page.getByRole('heading', { name: 'Cases' }).waitFor();
    const expected = navSectionsFor(role as Role).map((s) => NAV_LABELS[s]);
    expect(await navLabels(page)).toEqual(expected);
    expect((await navLabels(page)).includes('Team')).toBe(role === 'admin');
    // The name shows in the sidebar (the phone header holds a hidden copy).
    await expect(page.getByText(demo.name).filter({ visible: true }).first().isVisible()).resolves.toBe(true);
    await shot(page, `nav-${role}`);

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByText('You are signed out.').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    // The session is gone on the server: the app's pages send us back to sign-in.
    await page.goto(`${server.baseUrl}/cases`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(problemsOf(page)).toEqual([]);
    await page.context().close();
  });

  it('keeps a technician out of the Team page', async () => {
    const tech = DEMO_USERS.find((u) => u.role === 'tech')!;
    const page = await newPage();
    await signIn(page, tech.email, tech.password);
    await page.goto(`${server.baseUrl}/team`);
    await page.getByText('Not available for your role').waitFor();
    await shot(page, 'team-refused-tech');
    await page.goto(`${server.baseUrl}/capture-planner`);
    await page.getByText('Before you record at a running engine').waitFor();
    await shot(page, 'capture-planner');
    await page.context().close();
  });

  it('lets the admin invite someone, read the invite in the Outbox and follow its link', async () => {
    const admin = DEMO_USERS.find((u) => u.role === 'admin')!;
    const page = await newPage();
    await signIn(page, admin.email, admin.password);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
    await page.getByRole('heading', { name: 'Team' }).waitFor();
    const email = `e2e.invitee.${Date.now()}@demo.crankwise.test`;
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Role', { exact: true }).selectOption('specialist');
    await page.getByRole('button', { name: 'Send invite' }).click();
    await page.getByRole('cell', { name: email }).waitFor();
    await shot(page, 'team-admin');

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    await page.getByRole('heading', { name: 'Outbox' }).waitFor();
    await openOutboxMessage(page, email);
    const inviteLink = page.getByRole('article').getByRole('link', { name: /\/invite\// });
    await inviteLink.waitFor();
    await shot(page, 'outbox-message');
    const href = await inviteLink.getAttribute('href');
    expect(href).toMatch(/\/invite\/[^/]+$/);

    // The invitee opens the link in a browser of their own.
    const invitee = await newPage();
    await invitee.goto(href!.replace(/^https?:\/\/[^/]+/, server.baseUrl));
    await invitee.getByText(email).waitFor();
    await invitee.getByLabel('Your name').fill('Wren Halloway');
    await invitee.getByLabel('Choose a password').fill('a sturdy e2e password');
    invited = { email, password: 'a sturdy e2e password' };
    await shot(invitee, 'invite-accept');
    await invitee.getByRole('button', { name: /^Join / }).click();
    await invitee.getByRole('heading', { name: 'Cases' }).waitFor();
    expect(await navLabels(invitee)).toEqual(navSectionsFor('specialist').map((s) => NAV_LABELS[s]));
    expect(problemsOf(invitee)).toEqual([]);
    await invitee.context().close();
    expect(problemsOf(page)).toEqual([]);
    await page.context().close();
  });

  it('resets a forgotten password through the e-mailed link, once', async () => {
    if (!invited) throw new Error('needs the user created by the invite test above, which did not finish');
    const member = { ...invited, role: 'specialist' as const };
    const admin = DEMO_USERS.find((u) => u.role === 'admin')!;
    const visitor = await newPage();
    await visitor.goto(`${server.baseUrl}/sign-in`);
    await visitor.getByRole('link', { name: 'Forgot your password?' }).click();
    await visitor.getByLabel('E-mail').fill(member.email);
    await visitor.getByRole('button', { name: 'Send reset link' }).click();
    await visitor.getByText('Check your e-mail').waitFor();

    // The admin reads the mail fake's copy in the Outbox (no MAIL_URL in tests).
    const page = await newPage();
    await signIn(page, admin.email, admin.password);
    await openOutboxMessage(page, member.email, /invitation/i);
    const resetLink = page.getByRole('article').getByRole('link', { name: /\/reset-password\// });
    await resetLink.waitFor();
    const href = (await resetLink.getAttribute('href'))!.replace(/^https?:\/\/[^/]+/, server.baseUrl);
    await page.context().close();

    const newPassword = 'a brand new password';
    await visitor.goto(href);
    await visitor.getByLabel('New password', { exact: true }).fill(newPassword);
    await visitor.getByLabel('New password again').fill(newPassword);
    await visitor.getByRole('button', { name: 'Set new password' }).click();
    await visitor.getByText('Your password is set.').waitFor();
    await shot(visitor, 'reset-password-done');

    // The link works only once.
    await visitor.goto(href);
    await visitor.getByLabel('New password', { exact: true }).fill('yet another password');
    await visitor.getByLabel('New password again').fill('yet another password');
    await visitor.getByRole('button', { name: 'Set new password' }).click();
    await visitor.getByText('This link no longer works').waitFor();

    await signIn(visitor, member.email, newPassword);
    expect(await navLabels(visitor)).toEqual(navSectionsFor(member.role).map((s) => NAV_LABELS[s]));
    expect(problemsOf(visitor).filter((p) => !/Failed to load resource.*\b400\b/.test(p))).toEqual([]);
    await visitor.context().close();
  });

  it('looks right on a phone: navigation on top, the page below', async () => {
    const tech = DEMO_USERS.find((u) => u.role === 'tech')!;
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(tech.email);
    await page.getByLabel('Password').fill(tech.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Cases' }).waitFor();
    // Nothing is wider than the screen: no sideways scrolling of the whole page.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await shot(page, 'phone-cases');
    await context.close();
  });

  // Last: it creates a real shop, after which the set-up page is no longer offered.
  it('sets up a first real shop whose admin sees none of the demo shop', async () => {
    const page = await newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByRole('link', { name: 'Set up your shop' }).click();
    await page.getByLabel('Shop name').fill('Quillfeather Motor Works');
    await page.getByLabel('Admin name').fill('Maren Tolliver');
    await page.getByLabel('Admin e-mail').fill('maren@quillfeather.test');
    await page.getByLabel('Admin password').fill('first real admin password');
    await shot(page, 'setup');
    await page.getByRole('button', { name: 'Create shop and sign in' }).click();
    await page.getByRole('heading', { name: 'Team' }).waitFor();
    const emails = await page.getByRole('table').first().getByRole('row').allInnerTexts();
    expect(emails.filter((row) => row.includes('@'))).toHaveLength(1);
    expect(emails.join('\n')).toContain('maren@quillfeather.test');
    expect(emails.join('\n')).not.toContain('demo.crankwise.test');
    await expect(page.getByText('Demo shop').count()).resolves.toBe(0);
    await shot(page, 'setup-team');
    expect(problemsOf(page)).toEqual([]);
    await page.context().close();

    const later = await newPage();
    await later.goto(`${server.baseUrl}/setup`);
    await later.getByText('This installation is set up').waitFor();
    await later.context().close();
  });
});
