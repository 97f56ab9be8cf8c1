import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';

/** Where browser tests leave screenshots for a person to look at (git-ignored). */
export const SCREENSHOTS = path.resolve('tests/e2e/screenshots');

/**
 * Debian's Chromium, headless, with the flags this machine needs: no sandbox as root, and no
 * background connections (the network is closed; Chromium would retry them at every start).
 * Never a downloaded browser. `extraArgs` adds flags (e.g. a fake audio capture device).
 */
export async function launchChromium(extraArgs: string[] = []): Promise<Browser> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update',
      '--disable-sync', '--no-first-run', '--disable-quic', ...extraArgs],
  });
}

/** A full-page screenshot named `<name>.png` in SCREENSHOTS. */
export function screenshot(page: Page, name: string): Promise<Buffer> {
  return page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });
}
